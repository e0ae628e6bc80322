using System.Globalization;
using System.Security.Claims;
using System.Text;
using System.Text.Json;
using FeederLocate.Core.Formats;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;

namespace FeederLocate.Web.Api;

/// <summary>
/// <c>POST /api/incidents/{id}/protection</c>: the protection context of an open incident — any of
/// <c>faultAt</c>, <c>reclosing</c>, <c>fuses</c>, <c>relays</c> in the incident format's own shapes, read by
/// the incident reader so the messages are its own. A fault time later than the moment of entry, later
/// than the incident's report, or after a reading already entered is refused.
/// </summary>
internal static class ProtectionApi
{
    private static readonly string[] Fields = ["faultAt", "reclosing", "fuses", "relays"];

    public static async Task<IResult> Post(long id, ClaimsPrincipal user, HttpRequest request, IncidentBoard board, GridCatalog grids, TimeProvider clock)
    {
        if (await IncidentApi.Body(request) is not { } text)
        {
            return IncidentApi.BodyTooLarge();
        }

        return IncidentApi.InIncident(board, user, id, state =>
        {
            if (grids.For(state) is not { } grid)
            {
                return IncidentApi.NoGrid(id, state);
            }

            var wrapper = new StringBuilder();
            try
            {
                using var document = JsonDocument.Parse(text);
                if (document.RootElement.ValueKind != JsonValueKind.Object)
                {
                    return Results.BadRequest(ApiError.Single("not an object", "protection", "body", string.Empty, "must be an object with any of faultAt, reclosing, fuses, relays"));
                }

                var reportedAt = state.ReportedAt.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss.FFFFFFF'Z'", CultureInfo.InvariantCulture);
                wrapper.Append(CultureInfo.InvariantCulture, $$"""{ "format": "{{IncidentFormat.FormatTag}}", "reportedAt": "{{reportedAt}}", "faultType": "unknown", "indications": []""");
                foreach (var property in document.RootElement.EnumerateObject())
                {
                    if (!Fields.Contains(property.Name, StringComparer.Ordinal))
                    {
                        return Results.BadRequest(ApiError.Single("unknown field", "protection", "body", property.Name, "is not one of faultAt, reclosing, fuses, relays"));
                    }

                    wrapper.Append(", ").Append(JsonSerializer.Serialize(property.Name)).Append(": ").Append(property.Value.GetRawText());
                }

                wrapper.Append(" }");
            }
            catch (JsonException e)
            {
                return Results.BadRequest(ApiError.Single("not JSON", "request", "body", string.Empty, $"is not valid JSON: {e.Message}"));
            }

            var read = IncidentReader.Parse(wrapper.ToString(), grid.Grid);
            if (read.Value is not { } parsed)
            {
                return Results.BadRequest(ApiError.From("the protection context has errors", read.Issues));
            }

            if (parsed.FaultAt is { } faultAt)
            {
                if (faultAt > clock.GetUtcNow())
                {
                    return Results.BadRequest(ApiError.Single("in the future", "incident", "file", "faultAt", $"{IsoText(faultAt)} is later than now"));
                }

                if (state.Incident.Indications.FirstOrDefault(i => i.ReadAt < faultAt) is { } early)
                {
                    return Results.BadRequest(ApiError.Single("reading before the fault", "indication", early.Indicator.Value, "readAt",
                        $"{IsoText(early.ReadAt!.Value)} is before faultAt {IsoText(faultAt)}: give the fault time the readings allow"));
                }
            }

            board.Append(new IncidentId(id), ProtectionRecorded.Of(parsed), AccountClaims.ActorOf(user));
            return Results.Accepted($"/api/incidents/{id}", new { accepted = 1 });
        });
    }

    private static string IsoText(DateTimeOffset time) => time.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture);
}
