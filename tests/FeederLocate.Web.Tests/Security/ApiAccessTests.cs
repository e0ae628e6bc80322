using System.Net;
using System.Net.Http.Json;
using System.Text;
using System.Text.Json;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.Services;
using FeederLocate.Web.Tests.Support;
using Microsoft.Extensions.DependencyInjection;

namespace FeederLocate.Web.Tests.Security;

/// <summary>Who may do what through the API: tokens, roles, revocation, and incidents of grids outside an account's.</summary>
public sealed class ApiAccessTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    private const string OneIndication = """{ "indicator": "FPI-A1-04", "state": "fault", "source": "remote" }""";
    private static readonly Actor Engineer = new("admin", "engineer");

    private static StringContent Json(string text) => new(text, Encoding.UTF8, "application/json");

    private async Task<long> Open(HttpClient client, string grid, string trip)
    {
        var body = $$"""
            { "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", {{trip}} "faultType": "LG", "indications": [] }
            """;
        var response = await client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(grid)}", Json(body));
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        return (await response.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("id").GetInt64();
    }

    private IReadOnlyList<StoredEvent> Events(long id) =>
        app.Factory.Services.GetRequiredService<IncidentBoard>().Events(new IncidentId(id));

    [Fact]
    public async Task A_request_without_a_token_is_a_401_naming_the_header_and_changes_nothing()
    {
        var id = await Open(app.Client, ApiFixture.SolidGrid, "\"trippedDevice\": \"CB-A1\",");

        var read = await app.Anonymous.GetAsync("/api/incidents");
        var post = await app.Anonymous.PostAsync($"/api/incidents/{id}/indications", Json(OneIndication));
        using var wrongScheme = new HttpRequestMessage(HttpMethod.Get, "/api/incidents");
        wrongScheme.Headers.TryAddWithoutValidation("Authorization", "Basic YWRtaW46YWRtaW4=");
        var basic = await app.Anonymous.SendAsync(wrongScheme);

        Assert.Equal(HttpStatusCode.Unauthorized, read.StatusCode);
        Assert.Equal(HttpStatusCode.Unauthorized, post.StatusCode);
        Assert.Equal(HttpStatusCode.Unauthorized, basic.StatusCode);
        Assert.Equal("Bearer", read.Headers.WwwAuthenticate.Single().Scheme);
        var problem = (await read.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("problems")[0];
        Assert.Equal("Authorization", problem.GetProperty("field").GetString());
        Assert.Single(Events(id));
    }

    [Fact]
    public async Task A_viewer_reads_but_cannot_post_and_nothing_is_logged()
    {
        var viewer = app.ClientWith(app.ViewerToken);
        var id = await Open(app.Client, ApiFixture.SolidGrid, "\"trippedDevice\": \"CB-A1\",");

        var list = await viewer.GetAsync("/api/incidents");
        var ranking = await viewer.GetAsync($"/api/incidents/{id}/ranking");
        var indications = await viewer.PostAsync($"/api/incidents/{id}/indications", Json(OneIndication));
        var measurements = await viewer.PostAsync($"/api/incidents/{id}/measurements", Json("""{ "device": "CB-A1", "phaseCurrentA": 1880 }"""));
        var outcome = await viewer.PostAsync($"/api/incidents/{id}/outcome", Json("""{ "segment": "S109" }"""));
        var open = await viewer.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}", Json("{}"));

        Assert.Equal(HttpStatusCode.OK, list.StatusCode);
        Assert.Equal(HttpStatusCode.OK, ranking.StatusCode);
        Assert.All(new[] { indications, measurements, outcome, open }, r => Assert.Equal(HttpStatusCode.Forbidden, r.StatusCode));
        var problem = (await indications.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("problems")[0];
        Assert.Equal(("watcher", "role"), (problem.GetProperty("elementId").GetString(), problem.GetProperty("field").GetString()));
        Assert.Single(Events(id));
    }

    [Fact]
    public async Task A_revoked_token_is_refused_from_the_next_request_on()
    {
        var issued = app.Accounts.IssueToken("telecontrol", "gateway to retire", Engineer);
        var client = app.ClientWith(issued.Secret);
        var id = await Open(client, ApiFixture.SolidGrid, "\"trippedDevice\": \"CB-A1\",");

        app.Accounts.Revoke(issued.Token.Id, Engineer);
        var afterRead = await client.GetAsync($"/api/incidents/{id}");
        var afterPost = await client.PostAsync($"/api/incidents/{id}/indications", Json(OneIndication));

        Assert.Equal(HttpStatusCode.Unauthorized, afterRead.StatusCode);
        Assert.Equal(HttpStatusCode.Unauthorized, afterPost.StatusCode);
        Assert.Contains("revoked", await afterRead.Content.ReadAsStringAsync(), StringComparison.Ordinal);
        Assert.Single(Events(id));
        Assert.Equal(HttpStatusCode.OK, (await app.Client.GetAsync($"/api/incidents/{id}")).StatusCode);
    }

    [Fact]
    public async Task A_token_of_a_disabled_account_is_refused()
    {
        app.Accounts.CreateWithPassword("old-gateway", "Old gateway", Storage.Accounts.AccountRole.Operator, "old-gateway-password", null, Engineer);
        var client = app.ClientWith(app.Accounts.IssueToken("old-gateway", "old", Engineer).Secret);
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync("/api/grids")).StatusCode);

        app.Accounts.Disable("old-gateway", Engineer);

        Assert.Equal(HttpStatusCode.Unauthorized, (await client.GetAsync("/api/grids")).StatusCode);
    }

    [Fact]
    public async Task An_incident_of_another_grid_asked_for_by_id_is_answered_as_if_it_did_not_exist()
    {
        var solidOnly = app.ClientWith(app.SolidOnlyToken);
        var resonant = await Open(app.Client, "Marrowdell 20 kV (resonant, arc-suppression coil)", string.Empty);
        var solid = await Open(app.Client, ApiFixture.SolidGrid, "\"trippedDevice\": \"CB-A1\",");

        var unknown = await solidOnly.GetAsync("/api/incidents/987654");
        var other = await solidOnly.GetAsync($"/api/incidents/{resonant}");
        var otherRanking = await solidOnly.GetAsync($"/api/incidents/{resonant}/ranking");
        var otherPlan = await solidOnly.GetAsync($"/api/incidents/{resonant}/plan");
        var otherPost = await solidOnly.PostAsync($"/api/incidents/{resonant}/indications", Json("""{ "indicator": "FPI-A1-04", "state": "fault", "source": "remote" }"""));
        var otherOutcome = await solidOnly.PostAsync($"/api/incidents/{resonant}/outcome", Json("""{ "segment": "S109" }"""));
        var own = await solidOnly.GetAsync($"/api/incidents/{solid}");
        var list = await solidOnly.GetFromJsonAsync<JsonElement>("/api/incidents");
        var grids = await solidOnly.GetFromJsonAsync<JsonElement>("/api/grids");
        var openOther = await solidOnly.PostAsync($"/api/incidents?grid={Uri.EscapeDataString("Marrowdell 20 kV (resonant, arc-suppression coil)")}",
            Json("""{ "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "faultType": "LG", "indications": [] }"""));

        Assert.Equal(HttpStatusCode.NotFound, unknown.StatusCode);
        Assert.All(new[] { other, otherRanking, otherPlan, otherPost, otherOutcome }, r => Assert.Equal(HttpStatusCode.NotFound, r.StatusCode));
        var unknownProblem = (await unknown.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("problems")[0].GetProperty("message").GetString();
        var otherProblem = (await other.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("problems")[0].GetProperty("message").GetString();
        Assert.Equal(unknownProblem, otherProblem);
        Assert.Equal(HttpStatusCode.OK, own.StatusCode);
        Assert.All(list.EnumerateArray(), i => Assert.Equal(ApiFixture.SolidGrid, i.GetProperty("grid").GetString()));
        Assert.Contains(list.EnumerateArray(), i => i.GetProperty("id").GetInt64() == solid);
        Assert.Equal([ApiFixture.SolidGrid], grids.EnumerateArray().Select(g => g.GetProperty("name").GetString()));
        Assert.Equal(HttpStatusCode.BadRequest, openOther.StatusCode);
        Assert.Single(Events(resonant));
    }

    [Fact]
    public async Task Every_event_posted_through_the_api_carries_the_tokens_account_and_role()
    {
        var id = await Open(app.Client, ApiFixture.SolidGrid, "\"trippedDevice\": \"CB-A1\",");

        await app.Client.PostAsync($"/api/incidents/{id}/indications", Json($"[{OneIndication}]"));
        await app.Client.PostAsync($"/api/incidents/{id}/outcome", Json("""{ "segment": "S109" }"""));

        var events = Events(id);
        Assert.Equal(3, events.Count);
        Assert.All(events, e => Assert.Equal(new Actor("telecontrol", "operator"), e.Actor));
    }
}
