using System.Text.Json;
using System.Text.Json.Nodes;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Formats.Documents;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
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
    private static readonly Actor Integration = new("api", "operator");

    public static IEndpointRouteBuilder MapIncidentApi(this IEndpointRouteBuilder app)
    {
        var api = app.MapGroup("/api").WithTags("FeederLocate").WithMetadata(new RequestSizeLimitAttribute(MaximumBodyBytes));
        api.MapGet("/grids", (GridCatalog grids) => grids.All.Select(g => new GridEntry(
            g.Name, g.Key, g.Grid.Substations.Length, g.Grid.Segments.Length, g.Graph.Sections.All.Length, g.Grid.Indicators.Length)));
        api.MapGet("/incidents", (IncidentBoard board) => board.List().Select(IncidentEntry.Of));
        api.MapPost("/incidents", OpenIncident);
        api.MapGet("/incidents/{id:long}", (long id, IncidentBoard board) => WithIncident(board, id, state => Results.Ok(IncidentEntry.Of(IncidentSummary.Of(state)))));
        api.MapPost("/incidents/{id:long}/indications", (long id, HttpRequest request, IncidentBoard board, GridCatalog grids) =>
            PostEvidence(id, request, board, grids, "indications"));
        api.MapPost("/incidents/{id:long}/measurements", (long id, HttpRequest request, IncidentBoard board, GridCatalog grids) =>
            PostEvidence(id, request, board, grids, "measurements"));
        api.MapGet("/incidents/{id:long}/ranking", (long id, IncidentBoard board, GridCatalog grids, IncidentAnalysis analysis) =>
            WithIncident(board, id, state => grids.Find(state.GridName) is not { } grid
                ? GridNotLoaded(id, state)
                : analysis.Rank(grid, state) is { Result: { } ranking }
                    ? Results.Json(RankingDocument.From(ranking), DocumentJson.Options)
                    : Results.UnprocessableEntity(ApiError.Single("cannot rank", "incident", id.ToString(System.Globalization.CultureInfo.InvariantCulture), "switchStates", analysis.Rank(grid, state).Problem ?? "no ranking"))));
        api.MapGet("/incidents/{id:long}/plan", (long id, IncidentBoard board, GridCatalog grids, IncidentAnalysis analysis) =>
            WithIncident(board, id, state => grids.Find(state.GridName) is not { } grid
                ? GridNotLoaded(id, state)
                : analysis.Plan(grid, state) is { Plan: { } plan } && analysis.Rank(grid, state).Result is { } ranking
                    ? Results.Json(PlanDocument.From(plan, ranking), DocumentJson.Options)
                    : Results.UnprocessableEntity(ApiError.Single("cannot plan", "incident", id.ToString(System.Globalization.CultureInfo.InvariantCulture), "plan", analysis.Plan(grid, state).Problem ?? "no plan"))));
        api.MapPost("/incidents/{id:long}/outcome", PostOutcome);
        return app;
    }

    private static async Task<IResult> OpenIncident(HttpRequest request, string? grid, IncidentBoard board, GridCatalog grids)
    {
        if (grids.Find(grid ?? string.Empty) is not { } loaded)
        {
            return Results.BadRequest(ApiError.Single("unknown grid", "request", "query", "grid", $"must name a loaded grid ({string.Join(", ", grids.All.Select(g => $"\"{g.Name}\""))}), got \"{grid}\""));
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

        var id = board.Open(loaded, incident, Integration);
        return Results.Created($"/api/incidents/{id}", IncidentEntry.Of(IncidentSummary.Of(board.State(id))));
    }

    /// <summary>Indications or measurements, one object or an array, read by the incident reader itself so the messages are its own.</summary>
    private static async Task<IResult> PostEvidence(long id, HttpRequest request, IncidentBoard board, GridCatalog grids, string field)
    {
        if (await ReadBody(request) is not { } text)
        {
            return TooLarge();
        }

        return WithIncident(board, id, state =>
        {
            if (grids.Find(state.GridName) is not { } grid)
            {
                return GridNotLoaded(id, state);
            }

            JsonNode? body;
            try
            {
                body = JsonNode.Parse(text);
            }
            catch (JsonException e)
            {
                return Results.BadRequest(ApiError.Single("not JSON", "request", "body", string.Empty, $"is not valid JSON: {e.Message}"));
            }

            var items = body is JsonArray array ? array : new JsonArray(body?.DeepClone());
            var wrapper = new JsonObject
            {
                ["format"] = IncidentFormat.FormatTag,
                ["reportedAt"] = state.ReportedAt.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", System.Globalization.CultureInfo.InvariantCulture),
                ["faultType"] = "unknown",
                ["indications"] = field == "indications" ? items.DeepClone() : new JsonArray(),
            };
            if (field == "measurements")
            {
                wrapper["measurements"] = items.DeepClone();
            }

            var read = IncidentReader.Parse(wrapper.ToJsonString(), grid.Grid);
            if (read.Value is not { } parsed)
            {
                return Results.BadRequest(ApiError.From($"the {field} have errors", read.Issues));
            }

            IReadOnlyList<IncidentEvent> events = field == "indications"
                ? [.. parsed.Indications.Select(i => new IndicationEntered(i))]
                : [.. parsed.Measurements.Select(m => new MeasurementRecorded(m))];
            board.RecordAll(new IncidentId(id), events, Integration, grid.Grid);
            return Results.Accepted($"/api/incidents/{id}", new { accepted = events.Count });
        });
    }

    private static async Task<IResult> PostOutcome(long id, HttpRequest request, IncidentBoard board, GridCatalog grids)
    {
        if (await ReadBody(request) is not { } text)
        {
            return TooLarge();
        }

        return WithIncident(board, id, state =>
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

            board.Record(new IncidentId(id), new OutcomeLogged(new SegmentId(segment), type, body.Cause, body.Notes), Integration);
            return Results.Accepted($"/api/incidents/{id}", new { accepted = 1 });
        });
    }

    private static IResult GridNotLoaded(long id, IncidentState state) =>
        Results.Conflict(ApiError.Single("grid not loaded", "incident", id.ToString(System.Globalization.CultureInfo.InvariantCulture), "grid", $"\"{state.GridName}\" is not loaded"));

    private static IResult WithIncident(IncidentBoard board, long id, Func<IncidentState, IResult> action)
    {
        try
        {
            return action(board.State(new IncidentId(id)));
        }
        catch (UnknownIncidentException)
        {
            return Results.NotFound(ApiError.Single("unknown incident", "incident", id.ToString(System.Globalization.CultureInfo.InvariantCulture), "id", "does not exist"));
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

    /// <summary>The body as text, or null when it is over the limit (whatever the server in front enforces).</summary>
    private static async Task<string?> ReadBody(HttpRequest request)
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

    private static IResult TooLarge() => Results.Json(
        ApiError.Single("body too large", "request", "body", string.Empty, $"must be at most {MaximumBodyBytes} bytes"),
        statusCode: StatusCodes.Status413PayloadTooLarge);

    public sealed record GridEntry(string Name, string File, int Substations, int Segments, int Sections, int Indicators);

    public sealed record IncidentEntry(long Id, string Grid, DateTimeOffset ReportedAt, string Status, string FaultType, string? ConfirmedSegment, int Events)
    {
        public static IncidentEntry Of(IncidentSummary s) =>
            new(s.Id.Value, s.GridName, s.ReportedAt, s.Status.ToString(), IncidentFormat.Name(s.FaultType), s.ConfirmedSegment?.Value, s.EventCount);
    }

    public sealed record OutcomeBody(string? Segment, string? FaultType, string? Cause, string? Notes);
}
