using System.Text.Json;
using FeederLocate.Application.Analysis;
using FeederLocate.Application.Evidence;
using FeederLocate.Application.Switching;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Formats.Documents;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using System.Security.Claims;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;
using Microsoft.AspNetCore.Mvc;

namespace FeederLocate.Web.Api;

/// <summary>
/// The HTTP interface for telecontrol and other systems: grids and incidents, indications and
/// substation records (single or batch, in the incident format's own shapes), the ranking and the plan,
/// outcomes. Bodies are limited to 1 MB; bad input is a 400 naming the element and field.
/// </summary>
public static class IncidentApi
{
    public const long MaximumBodyBytes = 1_000_000;

    public static IEndpointRouteBuilder MapIncidentApi(this IEndpointRouteBuilder app)
    {
        var api = app.MapGroup("/api").WithTags("FeederLocate").WithMetadata(new RequestSizeLimitAttribute(MaximumBodyBytes))
            .RequireAuthorization(AccessPolicies.ApiRead);
        api.MapGet("/grids", (ClaimsPrincipal user, GridCatalog grids) => grids.VisibleTo(user).Select(g => new GridEntry(
            g.Name, g.Key, g.Grid.Substations.Length, g.Grid.Segments.Length, g.Graph.Sections.All.Length, g.Grid.Indicators.Length)));
        api.MapGet("/incidents", (ClaimsPrincipal user, IncidentBoard board) =>
            board.List().Where(i => AccountClaims.MaySee(user, i.GridName)).Select(IncidentEntry.Of));
        api.MapPost("/incidents", OpenIncident).RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapGet("/incidents/{id:long}", (long id, ClaimsPrincipal user, IncidentBoard board) =>
            WithIncident(board, user, id, state => Results.Ok(IncidentEntry.Of(IncidentSummary.Of(state)))));
        api.MapPost("/incidents/{id:long}/indications", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, EvidenceIntake intake) =>
            PostEvidence(id, user, request, board, grids, "indications", intake.AddIndications)).RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapPost("/incidents/{id:long}/measurements", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, EvidenceIntake intake) =>
            PostEvidence(id, user, request, board, grids, "measurements", intake.AddMeasurements)).RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapGet("/incidents/{id:long}/switches", (long id, ClaimsPrincipal user, IncidentBoard board, GridCatalog grids) =>
            WithIncident(board, user, id, state => grids.Find(state.GridName) is not { } grid
                ? GridNotLoaded(id, state)
                : Results.Ok(SwitchEntry.Of(grid.Grid, IncidentSwitching.Current(grid.Grid, state)))));
        api.MapGet("/incidents/{id:long}/ranking", (long id, ClaimsPrincipal user, IncidentBoard board, GridCatalog grids, IncidentAnalysis analysis) =>
            WithIncidentAsync(board, user, id, async state =>
            {
                if (grids.Find(state.GridName) is not { } grid)
                {
                    return GridNotLoaded(id, state);
                }

                var ranking = await analysis.RankAsync(grid.Graph, state);
                return ranking.Result is { } result
                    ? Results.Json(RankingDocument.From(result), DocumentJson.Options)
                    : Results.UnprocessableEntity(ApiError.Single("cannot rank", "incident", Text(id), "switchStates", ranking.Problem ?? "no ranking"));
            }));
        api.MapGet("/incidents/{id:long}/plan", (long id, ClaimsPrincipal user, IncidentBoard board, GridCatalog grids, IncidentAnalysis analysis) =>
            WithIncidentAsync(board, user, id, async state =>
            {
                if (grids.Find(state.GridName) is not { } grid)
                {
                    return GridNotLoaded(id, state);
                }

                var (ranking, plan) = await analysis.AnalyseAsync(grid.Graph, state);
                return plan.Plan is { } found && ranking.Result is { } result
                    ? Results.Json(PlanDocument.From(found, result), DocumentJson.Options)
                    : Results.UnprocessableEntity(ApiError.Single("cannot plan", "incident", Text(id), "plan", plan.Problem ?? "no plan"));
            }));
        api.MapPost("/incidents/{id:long}/outcome", PostOutcome).RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapSwitchingApi();
        api.MapLifecycleApi();
        return app;
    }

    private static async Task<IResult> OpenIncident(HttpRequest request, ClaimsPrincipal user, string? grid, IncidentBoard board, GridCatalog grids)
    {
        if (grids.Find(grid ?? string.Empty) is not { } loaded || !AccountClaims.MaySee(user, loaded.Name))
        {
            var offered = grids.VisibleTo(user).Select(g => $"\"{g.Name}\"");
            return Results.BadRequest(ApiError.Single("unknown grid", "request", "query", "grid", $"must name a loaded grid of this account ({string.Join(", ", offered)}), got \"{grid}\""));
        }

        if (await ReadBody(request) is not { } text)
        {
            return TooLarge();
        }

        var result = IncidentReader.Parse(text, loaded.Grid);
        if (result.Value is not { } incident)
        {
            return Results.BadRequest(ApiError.From("the incident has errors", result.Issues));
        }

        var id = board.Open(loaded, incident, AccountClaims.ActorOf(user));
        return Results.Created($"/api/incidents/{id}", IncidentEntry.Of(IncidentSummary.Of(board.State(id))));
    }

    /// <summary>Indications or measurements, one object or an array, read by the incident reader so the messages are its own.</summary>
    private static async Task<IResult> PostEvidence(long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, string field,
        Func<IncidentId, Core.Model.Grid, string, Actor, EvidenceResult> add)
    {
        if (await ReadBody(request) is not { } text)
        {
            return TooLarge();
        }

        return WithIncident(board, user, id, state =>
        {
            if (grids.Find(state.GridName) is not { } grid)
            {
                return GridNotLoaded(id, state);
            }

            var result = add(new IncidentId(id), grid.Grid, text, AccountClaims.ActorOf(user));
            return result.IsAccepted
                ? Results.Accepted($"/api/incidents/{id}", new { accepted = result.Accepted })
                : Results.BadRequest(ApiError.From($"the {field} have errors", result.Issues));
        });
    }

    private static async Task<IResult> PostOutcome(long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids)
    {
        if (await ReadBody(request) is not { } text)
        {
            return TooLarge();
        }

        return WithIncident(board, user, id, state =>
        {
            if (grids.Find(state.GridName) is not { } grid)
            {
                return GridNotLoaded(id, state);
            }

            OutcomeBody? body;
            try
            {
                body = JsonSerializer.Deserialize<OutcomeBody>(text, DocumentJson.Options);
            }
            catch (JsonException e)
            {
                return Results.BadRequest(ApiError.Single("not an outcome", "outcome", "body", string.Empty, $"is not valid: {e.Message}"));
            }

            if (body?.Segment is not { Length: > 0 } segment || !grid.Grid.HasSegment(new SegmentId(segment)))
            {
                return Results.BadRequest(ApiError.Single("unknown segment", "outcome", "body", "segment", $"must name a segment of grid {grid.Name}, got \"{body?.Segment}\""));
            }

            FaultType? type = null;
            if (body.FaultType is { } typeText && !IncidentFormat.FaultTypes.TryGetValue(typeText, out type))
            {
                return Results.BadRequest(ApiError.Single("bad fault type", "outcome", "body", "faultType", $"must be LG, LL, LLG, LLL or unknown, got \"{typeText}\""));
            }

            board.Record(new IncidentId(id), new OutcomeLogged(new SegmentId(segment), type, body.Cause, body.Notes), AccountClaims.ActorOf(user));
            return Results.Accepted($"/api/incidents/{id}", new { accepted = 1 });
        });
    }

    internal static string Text(long id) => id.ToString(System.Globalization.CultureInfo.InvariantCulture);

    internal static IResult UnknownIncident(long id) =>
        Results.NotFound(ApiError.Single("unknown incident", "incident", Text(id), "id", "does not exist"));

    internal static IResult GridNotLoaded(long id, IncidentState state) =>
        Results.Conflict(ApiError.Single("grid not loaded", "incident", id.ToString(System.Globalization.CultureInfo.InvariantCulture), "grid", $"\"{state.GridName}\" is not loaded"));

    /// <summary>
    /// Runs <paramref name="action"/> on the incident when the account may see its grid. An incident of a grid
    /// outside the account's grids is answered exactly like one that does not exist, so ids reveal nothing.
    /// </summary>
    internal static IResult WithIncident(IncidentBoard board, ClaimsPrincipal user, long id, Func<IncidentState, IResult> action)
    {
        try
        {
            var state = board.State(new IncidentId(id));
            return AccountClaims.MaySee(user, state.GridName) ? action(state) : UnknownIncident(id);
        }
        catch (UnknownIncidentException)
        {
            return UnknownIncident(id);
        }
        catch (IncidentClosedException e)
        {
            return Results.Conflict(ApiError.Single("incident closed", "incident", id.ToString(System.Globalization.CultureInfo.InvariantCulture), "status", e.Message));
        }
        catch (IncidentStoreException e)
        {
            return Results.BadRequest(ApiError.Single("refused", "incident", id.ToString(System.Globalization.CultureInfo.InvariantCulture), "body", e.Message));
        }
    }

    /// <summary><see cref="WithIncident"/> for an action that awaits.</summary>
    internal static async Task<IResult> WithIncidentAsync(IncidentBoard board, ClaimsPrincipal user, long id, Func<IncidentState, Task<IResult>> action)
    {
        IncidentState? found = null;
        var checkedResult = WithIncident(board, user, id, state =>
        {
            found = state;
            return Results.Empty;
        });
        return found is null ? checkedResult : await action(found);
    }

    /// <summary>The body as text, or null when it is over the limit (whatever the server in front enforces).</summary>
    internal static async Task<string?> ReadBody(HttpRequest request)
    {
        if (request.ContentLength > MaximumBodyBytes)
        {
            return null;
        }

        using var reader = new StreamReader(request.Body);
        var buffer = new char[MaximumBodyBytes + 1];
        var read = 0;
        int n;
        while (read < buffer.Length && (n = await reader.ReadAsync(buffer.AsMemory(read, buffer.Length - read))) > 0)
        {
            read += n;
        }

        return read > MaximumBodyBytes ? null : new string(buffer, 0, read);
    }

    internal static IResult TooLarge() => Results.Json(
        ApiError.Single("body too large", "request", "body", string.Empty, $"must be at most {MaximumBodyBytes} bytes"),
        statusCode: StatusCodes.Status413PayloadTooLarge);

    public sealed record GridEntry(string Name, string File, int Substations, int Segments, int Sections, int Indicators);

    public sealed record IncidentEntry(long Id, string Grid, DateTimeOffset ReportedAt, string Status, string FaultType, string? ConfirmedSegment, int Events, string Stage)
    {
        public static IncidentEntry Of(IncidentSummary s) =>
            new(s.Id.Value, s.GridName, s.ReportedAt, s.Status.ToString(), IncidentFormat.Name(s.FaultType), s.ConfirmedSegment?.Value, s.EventCount, IncidentStages.Name(s.Stage));
    }

    /// <summary>The incident's switch positions now, and those that differ from normal.</summary>
    public sealed record SwitchEntry(IReadOnlyDictionary<string, string> Positions, IReadOnlyDictionary<string, string> Deviations)
    {
        public static SwitchEntry Of(Core.Model.Grid grid, Core.Topology.SwitchStates states) => new(
            grid.Switches.ToDictionary(s => s.Id.Value, s => IncidentFormat.Name(states.PositionOf(s.Id))),
            states.Deviations().ToDictionary(d => d.Key.Value, d => IncidentFormat.Name(d.Value)));
    }

    public sealed record OutcomeBody(string? Segment, string? FaultType, string? Cause, string? Notes);
}
