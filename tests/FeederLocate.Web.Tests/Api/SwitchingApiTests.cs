using System.Net;
using System.Net.Http.Json;
using System.Text;
using System.Text.Json;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Api;

public sealed class SwitchingApiTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    private const string ResonantGrid = "Marrowdell 20 kV (resonant, arc-suppression coil)";

    private static StringContent Json(string text) => new(text, Encoding.UTF8, "application/json");

    private async Task<long> OpenResonant()
    {
        var text = File.ReadAllText(RepositoryFiles.Path("sample-grid", "incidents", "resonant-standing-earth-fault-b1.incident.json"));
        var opened = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ResonantGrid)}", Json(text));
        Assert.Equal(HttpStatusCode.Created, opened.StatusCode);
        return (await opened.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("id").GetInt64();
    }

    private static async Task<string> Message(HttpResponseMessage answer) =>
        (await answer.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("problems")[0].GetProperty("message").GetString()!;

    [Fact]
    public async Task Steps_are_ticked_in_order_a_step_out_of_order_is_refused_with_the_reason_and_a_tick_is_corrected_with_one()
    {
        var id = await OpenResonant();
        for (var order = 1; order <= 3; order++)
        {
            Assert.Equal(HttpStatusCode.Accepted, (await app.Client.PostAsync($"/api/incidents/{id}/steps", Json($$"""{ "order": {{order}} }"""))).StatusCode);
        }

        // Step 4 (open RC-B1-1) must come before step 5.
        var early = await app.Client.PostAsync($"/api/incidents/{id}/steps", Json("""{ "order": 5 }"""));
        var noOrder = await app.Client.PostAsync($"/api/incidents/{id}/steps", Json("""{ }"""));
        var noReason = await app.Client.PostAsync($"/api/incidents/{id}/corrections", Json("""{ "order": 3 }"""));
        var corrected = await app.Client.PostAsync($"/api/incidents/{id}/corrections", Json("""{ "order": 3, "reason": "ticked before the crew reported" }"""));

        Assert.Equal(HttpStatusCode.UnprocessableEntity, early.StatusCode);
        Assert.Equal("step 4 (open RC-B1-1) is not done yet: the steps are carried out in order", await Message(early));
        Assert.Equal(HttpStatusCode.BadRequest, noOrder.StatusCode);
        Assert.Equal(HttpStatusCode.UnprocessableEntity, noReason.StatusCode);
        Assert.Equal("give the reason for the correction", await Message(noReason));
        Assert.Equal(HttpStatusCode.Accepted, corrected.StatusCode);
        var board = Microsoft.Extensions.DependencyInjection.ServiceProviderServiceExtensions.GetRequiredService<Services.IncidentBoard>(app.Factory.Services);
        var state = board.State(new Storage.Incidents.IncidentId(id));
        Assert.Equal([1, 2], state.CompletedSteps.Select(d => d.Step.Order));
        Assert.Equal(new Actor("telecontrol", "operator"), Assert.Single(state.Corrections).Actor);
    }

    [Fact]
    public async Task Only_an_engineer_records_a_deviation_and_the_switch_positions_follow_it()
    {
        var id = await OpenResonant();
        app.Accounts.CreateWithPassword("eli", "Eli Grade", AccountRole.Engineer, "eli-password-1", null, new Actor("admin", "engineer"));
        var engineer = app.ClientWith(app.Accounts.IssueToken("eli", "desk 2", new Actor("admin", "engineer")).Secret);
        const string body = """{ "switch": "NO-A1-B1", "position": "closed", "reason": "feed B1 tail from A1 while the crew patrols" }""";

        var byOperator = await app.Client.PostAsync($"/api/incidents/{id}/deviations", Json(body));
        var noReason = await engineer.PostAsync($"/api/incidents/{id}/deviations", Json("""{ "switch": "NO-A1-B1", "position": "closed" }"""));
        var badPosition = await engineer.PostAsync($"/api/incidents/{id}/deviations", Json("""{ "switch": "NO-A1-B1", "position": "half", "reason": "x" }"""));
        var byEngineer = await engineer.PostAsync($"/api/incidents/{id}/deviations", Json(body));
        var positions = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/switches");

        Assert.Equal(HttpStatusCode.Forbidden, byOperator.StatusCode);
        Assert.Equal(HttpStatusCode.UnprocessableEntity, noReason.StatusCode);
        Assert.Equal(HttpStatusCode.BadRequest, badPosition.StatusCode);
        Assert.Equal("must be open or closed, got \"half\"", await Message(badPosition));
        Assert.Equal(HttpStatusCode.Accepted, byEngineer.StatusCode);
        Assert.Equal("closed", positions.GetProperty("positions").GetProperty("NO-A1-B1").GetString());
    }

    [Fact]
    public async Task A_switch_position_found_on_site_is_recorded_when_the_body_names_device_and_position()
    {
        var id = await OpenResonant();

        var unknown = await app.Client.PostAsync($"/api/incidents/{id}/switches", Json("""{ "switch": "LB-XX", "position": "open" }"""));
        var recorded = await app.Client.PostAsync($"/api/incidents/{id}/switches", Json("""{ "switch": "LB-B1-3", "position": "open" }"""));
        var positions = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/switches");

        Assert.Equal(HttpStatusCode.BadRequest, unknown.StatusCode);
        Assert.StartsWith("must name a switching device of grid", await Message(unknown), StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.Accepted, recorded.StatusCode);
        Assert.Equal("open", positions.GetProperty("positions").GetProperty("LB-B1-3").GetString());
    }

    [Fact]
    public async Task The_lifecycle_moves_on_closes_after_the_outcome_and_the_return_to_normal_and_refuses_with_reasons()
    {
        var opened = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}",
            Json("""{ "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG", "indications": [] }"""));
        var id = (await opened.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("id").GetInt64();

        var times = await app.Client.PostAsync($"/api/incidents/{id}/times", Json("""{ "faultAt": "2026-11-30T06:11:40Z" }"""));
        var lateReading = await app.Client.PostAsync($"/api/incidents/{id}/indications", Json("""{ "indicator": "FPI-A1-04", "state": "fault", "source": "field", "readAt": "2026-11-30T06:00:00Z" }"""));
        var located = await app.Client.PostAsync($"/api/incidents/{id}/stage", Json("""{ "stage": "located" }"""));
        var back = await app.Client.PostAsync($"/api/incidents/{id}/stage", Json("""{ "stage": "open" }"""));
        var closeEarly = await app.Client.PostAsync($"/api/incidents/{id}/close", Json("""{ }"""));
        var both = await app.Client.PostAsync($"/api/incidents/{id}/outcome", Json("""{ "segment": "S109", "noFaultFound": true }"""));
        var none = await app.Client.PostAsync($"/api/incidents/{id}/outcome", Json("""{ "noFaultFound": true, "transient": true, "faultType": "LG" }"""));
        var order = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/plan/return");
        var steps = order.GetProperty("steps").EnumerateArray().Select(s => s.GetProperty("order").GetInt32()).ToList();
        var outOfOrder = await app.Client.PostAsync($"/api/incidents/{id}/return/steps", Json($$"""{ "order": {{steps[^1]}} }"""));
        var ticks = new List<HttpResponseMessage>();
        foreach (var step in steps)
        {
            ticks.Add(await app.Client.PostAsync($"/api/incidents/{id}/return/steps", Json($$"""{ "order": {{step}} }""")));
        }

        var normal = ticks[^1];
        var closed = await app.Client.PostAsync($"/api/incidents/{id}/close", Json("""{ "note": "back to normal" }"""));
        var reopenByOperator = await app.Client.PostAsync($"/api/incidents/{id}/reopen", Json("""{ "reason": "again" }"""));
        var entry = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}");

        Assert.Equal(HttpStatusCode.Accepted, times.StatusCode);
        Assert.Equal(HttpStatusCode.BadRequest, lateReading.StatusCode);
        Assert.Equal("is before the fault began at 2026-11-30T06:11:40Z", (await Message(lateReading))[^"is before the fault began at 2026-11-30T06:11:40Z".Length..]);
        Assert.Equal(HttpStatusCode.Accepted, located.StatusCode);
        Assert.Equal(HttpStatusCode.UnprocessableEntity, back.StatusCode);
        Assert.Equal($"log the outcome of incident {id} before closing it", await Message(closeEarly));
        Assert.Equal(HttpStatusCode.BadRequest, both.StatusCode);
        Assert.Equal(HttpStatusCode.Accepted, none.StatusCode);
        Assert.True(steps.Count >= 2);
        Assert.Equal(HttpStatusCode.UnprocessableEntity, outOfOrder.StatusCode);
        Assert.StartsWith("return step 1 (", await Message(outOfOrder), StringComparison.Ordinal);
        Assert.All(ticks, t => Assert.Equal(HttpStatusCode.Accepted, t.StatusCode));
        Assert.Equal((HttpStatusCode.Accepted, HttpStatusCode.Accepted), (normal.StatusCode, closed.StatusCode));
        Assert.Equal("only an engineer reopens an incident", await Message(reopenByOperator));
        Assert.Equal(("Closed", "closed"), (entry.GetProperty("status").GetString(), entry.GetProperty("stage").GetString()));
    }

    [Fact]
    public async Task The_handover_lists_an_open_incident_with_what_is_off_and_its_next_step()
    {
        var opened = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}",
            Json("""{ "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG", "indications": [] }"""));
        var id = (await opened.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("id").GetInt64();
        await app.Client.PostAsync($"/api/incidents/{id}/indications", Json("""{ "indicator": "FPI-A1-04", "state": "fault", "source": "remote", "suspect": true }"""));

        var handover = await app.Client.GetFromJsonAsync<JsonElement>("/api/handover");
        var entry = handover.GetProperty("incidents").EnumerateArray().Single(i => i.GetProperty("id").GetInt64() == id);

        Assert.Equal("open", entry.GetProperty("stage").GetString());
        Assert.True(entry.GetProperty("customersOff").GetInt32() > 0);
        Assert.StartsWith("1. ", entry.GetProperty("nextStep").GetString(), StringComparison.Ordinal);
        Assert.Equal(["FPI-A1-04"], entry.GetProperty("distrustedIndicators").EnumerateArray().Select(i => i.GetString()));
        Assert.DoesNotContain("FPI-A1-04", entry.GetProperty("unreadIndicators").EnumerateArray().Select(i => i.GetString()));
        Assert.Contains("at the plan's estimate", entry.GetProperty("customerMinutesBasis").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public async Task An_indication_post_that_does_not_mention_suspect_keeps_the_distrust_mark()
    {
        var opened = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}",
            Json("""{ "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG", "indications": [] }"""));
        var id = (await opened.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("id").GetInt64();
        await app.Client.PostAsync($"/api/incidents/{id}/indications", Json("""{ "indicator": "FPI-A1-04", "state": "none", "source": "remote", "suspect": true }"""));

        var posted = await app.Client.PostAsync($"/api/incidents/{id}/indications", Json("""[{"indicator":"FPI-A1-04","state":"fault","source":"remote"}]"""));

        Assert.Equal(HttpStatusCode.Accepted, posted.StatusCode);
        var board = Microsoft.Extensions.DependencyInjection.ServiceProviderServiceExtensions.GetRequiredService<Services.IncidentBoard>(app.Factory.Services);
        var indication = board.State(new Storage.Incidents.IncidentId(id)).Incident.IndicationOf(new Core.Model.IndicatorId("FPI-A1-04"))!;
        Assert.Equal((Core.Evidence.IndicatorState.Fault, true), (indication.State, indication.Distrusted));
    }
}
