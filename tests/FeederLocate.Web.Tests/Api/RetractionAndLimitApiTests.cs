using System.Net;
using System.Net.Http.Json;
using Microsoft.Extensions.DependencyInjection;
using System.Text;
using System.Text.Json;
using FeederLocate.Core.Evidence;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Api;

/// <summary>
/// Through the API: evidence no radial network explains is refused, a wrong outcome is retracted by an engineer,
/// the limits the page applies hold here too, and a body that is not UTF-8 is refused.
/// </summary>
public sealed class RetractionAndLimitApiTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    private static StringContent Json(string text) => new(text, Encoding.UTF8, "application/json");

    private const string Evidence = """{ "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG", "indications": [] }""";

    private async Task<long> OpenAsync(string body = Evidence)
    {
        var opened = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}", Json(body));
        Assert.Equal(HttpStatusCode.Created, opened.StatusCode);
        using var created = JsonDocument.Parse(await opened.Content.ReadAsStringAsync());
        return created.RootElement.GetProperty("id").GetInt64();
    }

    private HttpClient Engineer()
    {
        var name = $"eng-{Guid.NewGuid():N}"[..12];
        app.Accounts.CreateWithPassword(name, "Shift engineer", AccountRole.Engineer, "engineer-password-1", null, new Actor("admin", "engineer"));
        return app.ClientWith(app.Accounts.IssueToken(name, "desk", new Actor("admin", "engineer")).Secret);
    }

    [Fact]
    public async Task An_incident_whose_switch_states_close_a_loop_is_refused_with_422_and_nothing_is_logged()
    {
        var before = (await app.Client.GetFromJsonAsync<JsonElement>("/api/incidents")).GetArrayLength();
        // NO-A1-A2 is a normally-open tie between feeders A1 and A2 of the demo grid: closing it makes a loop.
        var answer = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}",
            Json(Evidence.Replace("\"trippedDevice\"", "\"switchStates\": { \"NO-A1-A2\": \"closed\" }, \"trippedDevice\"", StringComparison.Ordinal)));

        Assert.Equal(HttpStatusCode.UnprocessableEntity, answer.StatusCode);
        Assert.StartsWith("application/problem+json", answer.Content.Headers.ContentType!.ToString(), StringComparison.Ordinal);
        Assert.Contains("radial", await answer.Content.ReadAsStringAsync(), StringComparison.Ordinal);
        Assert.Equal(before, (await app.Client.GetFromJsonAsync<JsonElement>("/api/incidents")).GetArrayLength());
    }

    [Fact]
    public async Task An_engineer_retracts_a_wrong_outcome_an_operator_may_not_and_a_second_retraction_is_a_conflict()
    {
        var id = await OpenAsync();
        Assert.Equal(HttpStatusCode.Accepted, (await app.Client.PostAsync($"/api/incidents/{id}/outcome", Json("""{ "segment": "S109" }"""))).StatusCode);
        var engineer = Engineer();
        var body = Json("""{ "reason": "the crew found the fault on S108" }""");

        var byOperator = await app.Client.PostAsync($"/api/incidents/{id}/outcome/retraction", body);
        var noReason = await engineer.PostAsync($"/api/incidents/{id}/outcome/retraction", Json("""{ "reason": " " }"""));
        var byEngineer = await engineer.PostAsync($"/api/incidents/{id}/outcome/retraction", body);
        var again = await engineer.PostAsync($"/api/incidents/{id}/outcome/retraction", body);
        var entry = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}");

        Assert.Equal(HttpStatusCode.Forbidden, byOperator.StatusCode);
        Assert.Equal(HttpStatusCode.BadRequest, noReason.StatusCode);
        Assert.Equal(HttpStatusCode.Accepted, byEngineer.StatusCode);
        Assert.Equal(HttpStatusCode.Conflict, again.StatusCode);
        Assert.Equal(JsonValueKind.Null, entry.GetProperty("confirmedSegment").ValueKind);
        var events = app.Factory.Services.GetRequiredService<Services.IncidentBoard>().Events(new Storage.Incidents.IncidentId(id));
        Assert.Equal("outcomeRetracted", events[^1].Kind);
        Assert.Equal(AccountRoles.Name(AccountRole.Engineer), events[^1].Actor.Role);
    }

    [Fact]
    public async Task Notes_and_a_cause_over_the_pages_limits_are_refused_naming_the_field()
    {
        var id = await OpenAsync();
        var notes = new string('n', EvidenceLimits.MaxNoteChars + 1);
        var cause = new string('c', EvidenceLimits.MaxCauseChars + 1);

        var longNotes = await app.Client.PostAsync($"/api/incidents/{id}/outcome", Json($$"""{ "segment": "S109", "notes": "{{notes}}" }"""));
        var longCause = await app.Client.PostAsync($"/api/incidents/{id}/outcome", Json($$"""{ "segment": "S109", "cause": "{{cause}}" }"""));
        var atLimit = await app.Client.PostAsync($"/api/incidents/{id}/outcome", Json($$"""{ "segment": "S109", "notes": "{{notes[1..]}}" }"""));

        Assert.Equal((HttpStatusCode.BadRequest, HttpStatusCode.BadRequest, HttpStatusCode.Accepted), (longNotes.StatusCode, longCause.StatusCode, atLimit.StatusCode));
        Assert.Contains("\"field\":\"notes\"", await longNotes.Content.ReadAsStringAsync(), StringComparison.Ordinal);
        Assert.Contains("\"field\":\"cause\"", await longCause.Content.ReadAsStringAsync(), StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_body_that_is_not_utf8_is_refused_and_nothing_is_logged()
    {
        var id = await OpenAsync();
        var before = (await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}")).GetProperty("events").GetInt32();
        // 0xC3 0x28 is an invalid two-byte sequence (RFC 3629, section 3).
        var bytes = Encoding.UTF8.GetBytes("""{ "indicator": "FPI-A1-04", "state": "fault", "source": "remote", "x": "?" }""");
        bytes[Array.LastIndexOf(bytes, (byte)'?')] = 0xC3;
        var content = new ByteArrayContent([.. bytes[..^3], 0x28, .. bytes[^3..]]);
        content.Headers.ContentType = new System.Net.Http.Headers.MediaTypeHeaderValue("application/json");

        var answer = await app.Client.PostAsync($"/api/incidents/{id}/indications", content);

        Assert.Equal(HttpStatusCode.BadRequest, answer.StatusCode);
        Assert.StartsWith("application/problem+json", answer.Content.Headers.ContentType!.ToString(), StringComparison.Ordinal);
        Assert.Contains("UTF-8", await answer.Content.ReadAsStringAsync(), StringComparison.Ordinal);
        Assert.Equal(before, (await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}")).GetProperty("events").GetInt32());
    }

    [Fact]
    public async Task The_openapi_document_states_the_limits()
    {
        var document = await app.Anonymous.GetStringAsync("/openapi/v1.json");

        Assert.Contains($"at most {EvidenceLimits.MaxMeasurementsPerIncident} devices", document, StringComparison.Ordinal);
        Assert.Contains($"notes hold at most {EvidenceLimits.MaxNoteChars} characters", document, StringComparison.Ordinal);
        Assert.Contains("/api/incidents/{id}/outcome/retraction", document, StringComparison.Ordinal);
    }
}
