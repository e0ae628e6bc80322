using System.Net;
using System.Net.Http.Json;
using System.Text;
using System.Text.Json;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Api;

/// <summary>The protection context through the API: on opening, and posted for an open incident.</summary>
public sealed class ProtectionApiTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    private static StringContent Json(string text) => new(text, Encoding.UTF8, "application/json");

    private async Task<long> Open(string body)
    {
        var response = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}", Json(body));
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        using var created = JsonDocument.Parse(await response.Content.ReadAsStringAsync());
        return created.RootElement.GetProperty("id").GetInt64();
    }

    [Fact]
    public async Task Protection_posted_for_an_open_incident_reaches_the_ranking()
    {
        var id = await Open("""
            { "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LL", "indications": [] }
            """);

        var posted = await app.Client.PostAsync($"/api/incidents/{id}/protection", Json("""
            { "faultAt": "2026-11-30T06:11:40Z", "fuses": { "FU-A1-6": "blown" },
              "relays": [ { "device": "CB-A1", "earthFaultDirection": "none" } ] }
            """));
        var ranking = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/ranking");

        Assert.Equal(HttpStatusCode.Accepted, posted.StatusCode);
        var assumptions = ranking.GetProperty("assumptions").EnumerateArray().Select(a => a.GetString()!).ToList();
        Assert.Contains(assumptions, a => a.StartsWith("fuses:", StringComparison.Ordinal));
        Assert.Contains(assumptions, a => a.StartsWith("relays:", StringComparison.Ordinal));
        Assert.False(ranking.GetProperty("transient").GetBoolean());
    }

    [Fact]
    public async Task An_incident_opened_with_a_successful_reclosure_ranks_as_transient()
    {
        var id = await Open("""
            { "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "faultAt": "2026-11-30T06:11:00Z",
              "trippedDevice": null, "faultType": "LL", "indications": [],
              "reclosing": { "device": "RC-B1-1", "attempts": 1, "result": "success" } }
            """);

        var ranking = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/ranking");

        Assert.True(ranking.GetProperty("transient").GetBoolean());
    }

    [Fact]
    public async Task A_relay_at_a_load_break_switch_is_a_400_naming_the_relay_and_nothing_is_kept()
    {
        var id = await Open("""
            { "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG", "indications": [] }
            """);

        var response = await app.Client.PostAsync($"/api/incidents/{id}/protection", Json("""{ "relays": [ { "device": "LB-A1-1", "earthFaultDirection": "forward" } ] }"""));
        var incident = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}");

        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        var problem = (await response.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("problems")[0];
        Assert.Equal("relay", problem.GetProperty("elementKind").GetString());
        Assert.Equal("LB-A1-1", problem.GetProperty("elementId").GetString());
        Assert.Equal("device", problem.GetProperty("field").GetString());
        Assert.Equal(1, incident.GetProperty("events").GetInt32());
    }

    [Fact]
    public async Task A_fault_time_in_the_future_or_after_a_reading_is_refused()
    {
        var id = await Open("""
            { "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG",
              "indications": [ { "indicator": "FPI-A1-01", "state": "forward", "source": "remote", "readAt": "2026-11-30T06:11:50Z" } ] }
            """);

        var future = await app.Client.PostAsync($"/api/incidents/{id}/protection", Json("""{ "faultAt": "2999-01-01T00:00:00Z" }"""));
        var afterReading = await app.Client.PostAsync($"/api/incidents/{id}/protection", Json("""{ "faultAt": "2026-11-30T06:11:55Z" }"""));
        var unknownField = await app.Client.PostAsync($"/api/incidents/{id}/protection", Json("""{ "faultTime": "2026-11-30T06:11:00Z" }"""));

        Assert.Equal(HttpStatusCode.BadRequest, future.StatusCode);
        Assert.Equal(HttpStatusCode.BadRequest, afterReading.StatusCode);
        Assert.Equal("FPI-A1-01", (await afterReading.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("problems")[0].GetProperty("elementId").GetString());
        Assert.Equal(HttpStatusCode.BadRequest, unknownField.StatusCode);
    }
}
