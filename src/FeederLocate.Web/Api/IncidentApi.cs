using FeederLocate.Application.History;
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
using FeederLocate.Application.Lifecycle;
using FeederLocate.Core.Topology;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;
using Microsoft.AspNetCore.Mvc;

namespace FeederLocate.Web.Api;

/// <summary>
/// The HTTP interface for telecontrol and other systems: grids and incidents, indications and
/// substation measurements (single or batch, in the incident format's own shapes), the ranking and the plan,
/// outcomes, and what a grid's outcomes have taught (<see cref="LearningDocument"/>). Bodies are limited to 1 MB; bad input is a 400 naming the element and field.
/// </summary>
public static class IncidentApi
{
    public const long MaximumBodyBytes = 1_000_000;

    public static IEndpointRouteBuilder MapIncidentApi(this IEndpointRouteBuilder app)
    {
        var api = app.MapGroup("/api").WithTags("FeederLocate").WithMetadata(new RequestSizeLimitAttribute(MaximumBodyBytes))
            .RequireAuthorization(AccessPolicies.ApiRead);
        api.MapGet("/grids", (ClaimsPrincipal user, GridCatalog grids) => grids.VisibleTo(user).Select(g => new GridEntry(
            g.Name, g.Key, g.Grid.Substations.Length, g.Grid.Segments.Length, g.Graph.Sections.All.Length, g.Grid.Indicators.Length, g.Version)));
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
            WithIncident(board, user, id, state => grids.For(state) is not { } grid
                ? GridNotLoaded(id, state)
                : Results.Ok(SwitchEntry.Of(grid.Grid, IncidentSwitching.Current(grid.Grid, state)))));
        api.MapPost("/incidents/{id:long}/protection", (long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, TimeProvider clock) =>
            ProtectionApi.Post(id, user, request, board, grids, clock)).RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapGet("/incidents/{id:long}/ranking", (long id, ClaimsPrincipal user, IncidentBoard board, GridCatalog grids, IncidentAnalysis analysis) =>
            WithIncidentAsync(board, user, id, async state =>
            {
                if (grids.For(state) is not { } grid)
                {
                    return GridNotLoaded(id, state);
                }

                var ranking = await analysis.RankAsync(grid.Graph, state);
                return ranking.Result is { } result
                    ? Results.Json(RankingDocument.From(result), DocumentJson.Options)
                    : Results.UnprocessableEntity(ApiError.Single("cannot rank", "incident", Text(id), "switchStates", ranking.Problem ?? "no ranking"));
            }));
        api.MapGet("/incidents/{id:long}/plan", (long id, string? section, ClaimsPrincipal user, IncidentBoard board, GridCatalog grids, IncidentAnalysis analysis) =>
            WithIncidentAsync(board, user, id, async state =>
            {
                if (grids.For(state) is not { } grid)
                {
                    return GridNotLoaded(id, state);
                }

                if (section is not null && !grid.Graph.Sections.Contains(new SectionId(section)))
                {
                    return Results.BadRequest(ApiError.Single("unknown section", "request", "query", "section", $"must name a section of grid \"{grid.Name}\", got \"{section}\""));
                }

                var ranking = await analysis.RankAsync(grid.Graph, state);
                var plan = await analysis.PlanForAsync(grid.Graph, state, section is null ? null : new SectionId(section));
                return plan.Plan is { } found && ranking.Result is { } result
                    ? Results.Json(PlanDocument.From(found, result), DocumentJson.Options)
                    : Results.UnprocessableEntity(ApiError.Single("cannot plan", "incident", Text(id), "plan", plan.Problem ?? "no plan"));
            }));
        api.MapGet("/incidents/{id:long}/plan/return", (long id, ClaimsPrincipal user, IncidentBoard board, GridCatalog grids, IncidentAnalysis analysis) =>
            WithIncidentAsync(board, user, id, async state =>
            {
                if (grids.For(state) is not { } grid)
                {
                    return GridNotLoaded(id, state);
                }

                var back = await analysis.ReturnAsync(grid.Graph, state);
                return back.Plan is { } found
                    ? Results.Json(ReturnPlanDocument.From(found), DocumentJson.Options)
                    : Results.UnprocessableEntity(ApiError.Single("cannot plan the return", "incident", Text(id), "plan", back.Problem ?? "no plan"));
            }));
        api.MapGet("/handover", async (ClaimsPrincipal user, GridCatalog grids, ShiftHandover handover, TimeProvider clock) =>
        {
            NetworkGraph? GraphOf(string name) => AccountClaims.MaySee(user, name) ? grids.Find(name)?.Graph : null;
            bool Visible(string name) => AccountClaims.MaySee(user, name);
            var entries = await handover.EntriesAsync(GraphOf, Visible);
            return Results.Json(HandoverDocument.From(clock.GetUtcNow(), entries, handover.IncidentsWithoutGrid(GraphOf, Visible)), DocumentJson.Options);
        });
        api.MapPost("/incidents/{id:long}/outcome", PostOutcome).RequireAuthorization(AccessPolicies.ApiWrite);
        api.MapGet("/learning", (string? grid, ClaimsPrincipal user, GridCatalog grids, GridLearning learning, LearningCurves curves) =>
            grids.Find(grid ?? string.Empty) is { } loaded && AccountClaims.MaySee(user, loaded.Name)
                ? Results.Ok(LearningDocument.From(loaded.Grid, learning.Outcomes(loaded.Graph).All.Count, learning.Learned(loaded.Graph), curves.For(loaded.Name)))
                : Results.BadRequest(ApiError.Single("unknown grid", "request", "query", "grid",
                    $"must name a loaded grid of this account ({string.Join(", ", grids.VisibleTo(user).Select(g => $"\"{g.Name}\""))}), got \"{grid}\"")));
        api.MapPost("/incidents/{id:long}/outcome/retraction", PostRetraction).RequireAuthorization(AccessPolicies.ApiEngineer);
        api.MapSwitchingApi();
        api.MapLifecycleApi();
        api.MapGridApi();
        return app;
    }

    private static async Task<IResult> OpenIncident(HttpRequest request, ClaimsPrincipal user, string? grid, IncidentBoard board, GridCatalog grids, TimeProvider clock)
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

        if (incident.FaultAt is { } faultAt && faultAt > clock.GetUtcNow())
        {
            return Results.BadRequest(ApiError.Single("in the future", "incident", "file", "faultAt", "is later than now"));
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
            if (grids.For(state) is not { } grid)
            {
                return GridNotLoaded(id, state);
            }

            var result = add(new IncidentId(id), grid.Grid, text, AccountClaims.ActorOf(user));
            return result.IsAccepted
                ? Results.Accepted($"/api/incidents/{id}", new { accepted = result.Accepted })
                : Results.BadRequest(ApiError.From($"the {field} have errors", result.Issues));
        });
    }

    internal static async Task<string?> Body(HttpRequest request) => await ReadBody(request);

    internal static IResult BodyTooLarge() => TooLarge();

    internal static IResult InIncident(IncidentBoard board, ClaimsPrincipal user, long id, Func<IncidentState, IResult> action) => WithIncident(board, user, id, action);

    internal static IResult NoGrid(long id, IncidentState state) => GridNotLoaded(id, state);

    private static async Task<IResult> PostOutcome(long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids)
    {
        if (await ReadBody(request) is not { } text)
        {
            return TooLarge();
        }

        return WithIncident(board, user, id, state =>
        {
            if (grids.For(state) is not { } grid)
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

            var noFault = body?.NoFaultFound == true || body?.Transient == true;
            if (noFault && body?.Segment is { Length: > 0 })
            {
                return Results.BadRequest(ApiError.Single("segment with no fault found", "outcome", "body", "segment", "must be left out when no fault was found"));
            }

            if (body is not null && noFault)
            {
                FaultType? found = null;
                if (body.FaultType is { } foundText && !IncidentFormat.FaultTypes.TryGetValue(foundText, out found))
                {
                    return Results.BadRequest(ApiError.Single("bad fault type", "outcome", "body", "faultType", $"must be LG, LL, LLG, LLL or unknown, got \"{foundText}\""));
                }

                if (TooLong(id, "notes", body.Notes, EvidenceLimits.MaxNoteChars) is { } tooLongNote)
                {
                    return tooLongNote;
                }

                board.Append(new IncidentId(id), new NoFaultFoundLogged(body.Transient == true, found, body.Notes), AccountClaims.ActorOf(user));
                return Results.Accepted($"/api/incidents/{id}", new { accepted = 1 });
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

            if ((TooLong(id, "cause", body.Cause, EvidenceLimits.MaxCauseChars) ?? TooLong(id, "notes", body.Notes, EvidenceLimits.MaxNoteChars)) is { } tooLong)
            {
                return tooLong;
            }

            board.Append(new IncidentId(id), new OutcomeLogged(new SegmentId(segment), type, body.Cause, body.Notes), AccountClaims.ActorOf(user));
            return Results.Accepted($"/api/incidents/{id}", new { accepted = 1 });
        });
    }

    /// <summary>An engineer withdraws the outcome in force with a logged retraction; the learning leaves it out from then on.</summary>
    private static async Task<IResult> PostRetraction(long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board)
    {
        if (await ReadBody(request) is not { } text)
        {
            return TooLarge();
        }

        return WithIncident(board, user, id, state =>
        {
            RetractionBody? body;
            try
            {
                body = JsonSerializer.Deserialize<RetractionBody>(text, DocumentJson.Options);
            }
            catch (JsonException e)
            {
                return Results.BadRequest(ApiError.Single("not a retraction", "retraction", "body", string.Empty, $"is not valid: {e.Message}"));
            }

            if (string.IsNullOrWhiteSpace(body?.Reason))
            {
                return Results.BadRequest(ApiError.Single("no reason", "retraction", "body", "reason", "must say why the outcome is withdrawn"));
            }

            if (TooLong(id, "reason", body.Reason, EvidenceLimits.MaxCauseChars) is { } tooLong)
            {
                return tooLong;
            }

            if (state.Outcome is null)
            {
                return Results.Conflict(ApiError.Single("no outcome", "incident", Text(id), "outcome", "has no outcome in force: there is nothing to retract"));
            }

            board.Append(new IncidentId(id), new OutcomeRetracted(body.Reason.Trim()), AccountClaims.ActorOf(user));
            return Results.Accepted($"/api/incidents/{id}", new { accepted = 1 });
        });
    }

    private static IResult? TooLong(long id, string field, string? text, int maxChars) => text is { Length: var length } && length > maxChars
        ? Results.BadRequest(ApiError.Single("too long", "outcome", Text(id), field, $"holds {length} characters; at most {maxChars} are accepted"))
        : null;

    internal static string Text(long id) => id.ToString(System.Globalization.CultureInfo.InvariantCulture);

    internal static IResult UnknownIncident(long id) =>
        Results.NotFound(ApiError.Single("unknown incident", "incident", Text(id), "id", "does not exist"));

    internal static IResult GridNotLoaded(long id, IncidentState state) =>
        Results.Conflict(ApiError.Single("grid not loaded", "incident", id.ToString(System.Globalization.CultureInfo.InvariantCulture), "grid", $"version {state.GridVersion} of \"{state.GridName}\" is not stored"));

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
        catch (OutcomeNotLoggedException e)
        {
            return Results.Conflict(ApiError.Single("no outcome", "incident", Text(id), "outcome", e.Message));
        }
        catch (EvidenceLimitException e)
        {
            return Results.BadRequest(ApiError.Single("over a limit", "incident", Text(id), e.Field, e.Message));
        }
        catch (EvidenceNotRadialException e)
        {
            return Results.UnprocessableEntity(ApiError.Single("not radial", "incident", Text(id), "switchStates", e.Message));
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

    private static readonly System.Text.UTF8Encoding StrictUtf8 = new(encoderShouldEmitUTF8Identifier: false, throwOnInvalidBytes: true);

    /// <summary>
    /// The body as text, or null when it is over the limit (whatever the server in front enforces). A body that is
    /// not valid UTF-8 is refused (<see cref="BodyNotUtf8Exception"/>, a 400 problem), never silently repaired.
    /// </summary>
    internal static async Task<string?> ReadBody(HttpRequest request)
    {
        if (request.ContentLength > MaximumBodyBytes)
        {
            return null;
        }

        using var reader = new StreamReader(request.Body, StrictUtf8);
        var buffer = new char[MaximumBodyBytes + 1];
        var read = 0;
        int n;
        try
        {
            while (read < buffer.Length && (n = await reader.ReadAsync(buffer.AsMemory(read, buffer.Length - read))) > 0)
            {
                read += n;
            }
        }
        catch (System.Text.DecoderFallbackException)
        {
            throw new BodyNotUtf8Exception();
        }

        return read > MaximumBodyBytes ? null : new string(buffer, 0, read);
    }

    internal static IResult TooLarge() => Results.Json(
        ApiError.Single("body too large", "request", "body", string.Empty, $"must be at most {MaximumBodyBytes} bytes"),
        statusCode: StatusCodes.Status413PayloadTooLarge);

    public sealed record GridEntry(string Name, string File, int Substations, int Segments, int Sections, int Indicators, int Version);

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

    /// <param name="NoFaultFound">True: the patrol found no fault (no segment then); <paramref name="Transient"/>: it cleared by itself.</param>
    public sealed record OutcomeBody(string? Segment, string? FaultType, string? Cause, string? Notes, bool? NoFaultFound = null, bool? Transient = null);

    public sealed record RetractionBody(string? Reason);
}
