using System.Security.Claims;
using FeederLocate.Application.Lifecycle;
using FeederLocate.Application.Times;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;

namespace FeederLocate.Web.Api;

/// <summary>
/// An incident's lifecycle and times over HTTP, with the page's rules (<see cref="IncidentLifecycle"/>,
/// <see cref="IncidentTimesEntry"/>): move on a stage, put a switch back to normal, close, reopen (engineers),
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
        api.MapPost("/incidents/{id:long}/normal", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, IncidentLifecycle lifecycle) =>
            SwitchingApi.WithBody<SwitchingApi.PositionBody>(id, user, request, board, grids, "return to normal", (grid, body) => Task.FromResult(
                body.Switch is { Length: > 0 } device && grid.Grid.HasSwitch(new SwitchId(device))
                    ? SwitchingApi.Answer(id, "switch", device, lifecycle.ReturnToNormal(grid.Graph, new IncidentId(id), new SwitchId(device), AccountClaims.ActorOf(user)))
                    : SwitchingApi.Bad("return to normal", "switch", $"must name a switching device of grid {grid.Name}, got \"{body.Switch}\""))))
            .RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapPost("/incidents/{id:long}/close", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, IncidentLifecycle lifecycle) =>
            SwitchingApi.WithBody<NoteBody>(id, user, request, board, grids, "closing", (grid, body) => Task.FromResult(
                SwitchingApi.Answer(id, "incident", IncidentApi.Text(id), lifecycle.Close(grid.Grid, new IncidentId(id), body.Note, AccountClaims.ActorOf(user))))))
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
