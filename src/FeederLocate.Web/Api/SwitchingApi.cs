using System.Security.Claims;
using System.Text.Json;
using FeederLocate.Application.Switching;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Formats.Documents;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;

namespace FeederLocate.Web.Api;

/// <summary>
/// Carrying out an incident's switching order over HTTP, with the page's checks (<see cref="CheckedSwitching"/>):
/// a step ticked by number, a mistaken tick withdrawn with a reason, a deviation (engineers only), and a switch
/// position found on site. A refused step is a 422 whose message gives the reason; nothing is logged then.
/// </summary>
internal static class SwitchingApi
{
    public static void MapSwitchingApi(this RouteGroupBuilder api)
    {
        api.MapPost("/incidents/{id:long}/steps", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, CheckedSwitching switching) =>
            WithBody<StepBody>(id, user, request, board, grids, "step", async (grid, body) => body.Order is not { } order
                ? Bad("step", "order", "must give the step's number")
                : Answer(id, "step", Text(order), await switching.TickAsync(grid.Graph, new IncidentId(id), order, AccountClaims.ActorOf(user), body.DoneAt))))
            .RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapPost("/incidents/{id:long}/corrections", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, CheckedSwitching switching) =>
            WithBody<CorrectionBody>(id, user, request, board, grids, "correction", (_, body) => Task.FromResult(body.Order is not { } order
                ? Bad("correction", "order", "must give the number of the step ticked by mistake")
                : Answer(id, "step", Text(order), switching.Correct(new IncidentId(id), order, body.Reason ?? string.Empty, AccountClaims.ActorOf(user))))))
            .RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapPost("/incidents/{id:long}/deviations", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, CheckedSwitching switching) =>
            WithBody<PositionBody>(id, user, request, board, grids, "deviation", async (grid, body) =>
            {
                if (!AccountClaims.Holds(user, AccountRole.Engineer))
                {
                    return Results.Json(ApiError.Single("engineers only", "deviation", IncidentApi.Text(id), "account", "only an engineer may record a deviation from the switching order"),
                        statusCode: StatusCodes.Status403Forbidden);
                }

                return Position(grid, body, "deviation") is { } problem
                    ? problem
                    : Answer(id, "switch", body.Switch!, await switching.DeviateAsync(grid.Graph, new IncidentId(id), new SwitchId(body.Switch!),
                        IncidentFormat.Positions[body.Position!], body.Reason ?? string.Empty, AccountClaims.ActorOf(user)));
            }))
            .RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapPost("/incidents/{id:long}/switches", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, CheckedSwitching switching) =>
            WithBody<PositionBody>(id, user, request, board, grids, "switch position", (grid, body) => Task.FromResult(
                Position(grid, body, "switch position") ?? Answer(id, "switch", body.Switch!,
                    switching.Found(grid.Graph, new IncidentId(id), new SwitchId(body.Switch!), IncidentFormat.Positions[body.Position!], AccountClaims.ActorOf(user))))))
            .RequireAuthorization(AccessPolicies.ApiWrite);
    }

    internal static async Task<IResult> WithBody<T>(long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, string what,
        Func<LoadedGrid, T, Task<IResult>> action)
        where T : class
    {
        if (await IncidentApi.ReadBody(request) is not { } text)
        {
            return IncidentApi.TooLarge();
        }

        return await IncidentApi.WithIncidentAsync(board, user, id, async state =>
        {
            if (grids.For(state) is not { } grid)
            {
                return IncidentApi.GridNotLoaded(id, state);
            }

            T? body;
            try
            {
                body = JsonSerializer.Deserialize<T>(text, DocumentJson.Options);
            }
            catch (JsonException e)
            {
                return Bad(what, "body", $"is not valid: {e.Message}");
            }

            if (body is null)
            {
                return Bad(what, "body", "is empty");
            }

            try
            {
                return await action(grid, body);
            }
            catch (IncidentClosedException e)
            {
                return Results.Conflict(ApiError.Single("incident closed", "incident", IncidentApi.Text(id), "status", e.Message));
            }
            catch (IncidentStoreException e)
            {
                return Results.BadRequest(ApiError.Single("refused", "incident", IncidentApi.Text(id), "body", e.Message));
            }
        });
    }

    private static IResult? Position(LoadedGrid grid, PositionBody body, string what)
    {
        if (body.Switch is not { Length: > 0 } device || !grid.Grid.HasSwitch(new SwitchId(device)))
        {
            return Bad(what, "switch", $"must name a switching device of grid {grid.Name}, got \"{body.Switch}\"");
        }

        return body.Position is { } position && IncidentFormat.Positions.ContainsKey(position)
            ? null
            : Bad(what, "position", $"must be open or closed, got \"{body.Position}\"");
    }

    internal static IResult Answer(long id, string elementKind, string elementId, StepDecision decision) => decision.IsLogged
        ? Results.Accepted($"/api/incidents/{id}", new { accepted = 1 })
        : Results.UnprocessableEntity(ApiError.Single("refused", elementKind, elementId, "switching", decision.Refusal!));

    internal static IResult Bad(string what, string field, string message) =>
        Results.BadRequest(ApiError.Single($"bad {what}", what, "body", field, message));

    private static string Text(int value) => value.ToString(System.Globalization.CultureInfo.InvariantCulture);

    public sealed record StepBody(int? Order, DateTimeOffset? DoneAt);

    public sealed record CorrectionBody(int? Order, string? Reason);

    public sealed record PositionBody(string? Switch, string? Position, string? Reason);
}
