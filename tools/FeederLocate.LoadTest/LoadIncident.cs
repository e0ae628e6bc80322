using System.Globalization;
using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.LoadTest;

/// <summary>An incident opened for the load, with the grid its indications must fit.</summary>
public sealed record LoadIncident(long Id, Grid Grid, DateTimeOffset ReportedAt)
{
    /// <summary>
    /// Opens incident number <paramref name="index"/> on <paramref name="grid"/> through the API: a trip of
    /// a feeder breaker where earth faults trip (solid, impedance), a standing earth fault where they
    /// usually do not (isolated, resonant).
    /// </summary>
    public static async Task<LoadIncident> OpenAsync(HttpClient http, Grid grid, int index, DateTimeOffset reportedAt, CancellationToken cancellation)
    {
        ArgumentNullException.ThrowIfNull(http);
        ArgumentNullException.ThrowIfNull(grid);
        var breakers = grid.Switches.Where(s => s.Kind == SwitchKind.Breaker && !s.NormallyOpen).Select(s => s.Id.Value).Order(StringComparer.Ordinal).ToList();
        var trips = grid.Substations.All(s => s.Grounding.Scheme is GroundingScheme.Solid or GroundingScheme.Impedance) && breakers.Count > 0;
        var body = new Dictionary<string, object?>
        {
            ["format"] = IncidentFormat.FormatTag,
            ["reportedAt"] = reportedAt.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture),
            ["trippedDevice"] = trips ? breakers[index % breakers.Count] : null,
            ["faultType"] = "LG",
            ["indications"] = Array.Empty<object>(),
        };
        using var response = await http.PostAsJsonAsync($"/api/incidents?grid={Uri.EscapeDataString(grid.Name)}", body, cancellation);
        var text = await response.Content.ReadAsStringAsync(cancellation);
        if (response.StatusCode != HttpStatusCode.Created)
        {
            throw new InvalidOperationException($"opening an incident on \"{grid.Name}\" gave {(int)response.StatusCode} {response.StatusCode}: {text}");
        }

        using var created = JsonDocument.Parse(text);
        return new LoadIncident(created.RootElement.GetProperty("id").GetInt64(), grid, reportedAt);
    }
}
