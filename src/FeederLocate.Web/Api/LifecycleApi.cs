using System.Security.Claims;
using FeederLocate.Application.Lifecycle;
using FeederLocate.Application.Switching;
using FeederLocate.Application.Times;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;

namespace FeederLocate.Web.Api;

/// <summary>
/// An incident's lifecycle and times over HTTP, with the page's rules (<see cref="IncidentLifecycle"/>,
/// <see cref="IncidentTimesEntry"/>): move on a stage, tick a step of the return to normal, close, reopen (engineers),
/// and the fault, trip and reclosure times. A refusal is a 422 whose message gives the reason.
/// </summary>
internal static class LifecycleApi
{
    public static void MapLifecycleApi(this RouteGroupBuilder api)
    {
        api.MapPost("/incidents/{id:long}/stage", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, IncidentLifecycle lifecycle) =>
            SwitchingApi.WithBody<StageBody>(id, user, request, board, grids, "stage", (_, body) => Task.FromResult(
                IncidentStages.TryParse(body.Stage, out var stage)
                    ? SwitchingApi.Answer(id, "incident", IncidentApi.Text(id), lifecycle.MoveTo(new IncidentId(id), stage, AccountClaims.ActorOf(user)))
                    : SwitchingApi.Bad("stage", "stage", $"must be located, isolated, restored or repaired, got \"{body.Stage}\""))))
            .RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapPost("/incidents/{id:long}/return/steps", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, ReturnSwitching back) =>
            SwitchingApi.WithBody<SwitchingApi.StepBody>(id, user, request, board, grids, "return step", async (grid, body) => body.Order is not { } order
                ? SwitchingApi.Bad("return step", "order", "must give the step's number in the return order")
                : SwitchingApi.Answer(id, "return step", order.ToString(System.Globalization.CultureInfo.InvariantCulture),
                    await back.TickAsync(grid.Graph, new IncidentId(id), order, AccountClaims.ActorOf(user), body.DoneAt))))
            .RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapPost("/incidents/{id:long}/close", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, IncidentLifecycle lifecycle) =>
            SwitchingApi.WithBody<NoteBody>(id, user, request, board, grids, "closing", async (grid, body) =>
                SwitchingApi.Answer(id, "incident", IncidentApi.Text(id), await lifecycle.CloseAsync(grid.Graph, new IncidentId(id), body.Note, AccountClaims.ActorOf(user)))))
            .RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapPost("/incidents/{id:long}/reopen", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, IncidentLifecycle lifecycle) =>
            SwitchingApi.WithBody<NoteBody>(id, user, request, board, grids, "reopening", (_, body) => Task.FromResult(
                SwitchingApi.Answer(id, "incident", IncidentApi.Text(id), lifecycle.Reopen(new IncidentId(id), body.Reason ?? string.Empty, AccountClaims.ActorOf(user))))))
            .RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapPost("/incidents/{id:long}/times", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, IncidentTimesEntry times) =>
            SwitchingApi.WithBody<TimesBody>(id, user, request, board, grids, "times", (_, body) => Task.FromResult(
                SwitchingApi.Answer(id, "incident", IncidentApi.Text(id), times.Enter(new IncidentId(id), body.FaultAt, body.TrippedAt, body.ReclosedAt, AccountClaims.ActorOf(user))))))
            .RequireAuthorization(AccessPolicies.ApiWrite);
    }

    public sealed record StageBody(string? Stage);

    public sealed record NoteBody(string? Note, string? Reason);

    public sealed record TimesBody(DateTimeOffset? FaultAt, DateTimeOffset? TrippedAt, DateTimeOffset? ReclosedAt);
}
