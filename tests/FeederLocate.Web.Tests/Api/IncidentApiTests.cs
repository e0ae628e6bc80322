using System.Net;
using System.Net.Http.Json;
using System.Text;
using System.Text.Json;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Api;

public sealed class IncidentApiTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    private const string SolidGrid = ApiFixture.SolidGrid;

    private static StringContent Json(string text) => new(text, Encoding.UTF8, "application/json");

    private async Task<long> OpenSolidTrip()
    {
        var body = """
            { "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG",
              "indications": [] }
            """;
        var response = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(SolidGrid)}", Json(body));
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        using var created = JsonDocument.Parse(await response.Content.ReadAsStringAsync());
        return created.RootElement.GetProperty("id").GetInt64();
    }

    [Fact]
    public async Task Telecontrol_posts_a_batch_of_indications_and_reads_the_ranking_and_the_plan()
    {
        var id = await OpenSolidTrip();
        var batch = """
            [ { "indicator": "FPI-A1-01", "state": "forward", "source": "remote", "readAt": "2026-11-30T06:12:30Z" },
              { "indicator": "FPI-A1-04", "state": "fault", "source": "remote" },
              { "indicator": "FPI-A1-11", "state": "forward", "source": "remote" },
              { "indicator": "FPI-A1-14", "state": "none", "source": "remote" } ]
            """;

        var posted = await app.Client.PostAsync($"/api/incidents/{id}/indications", Json(batch));
        var record = await app.Client.PostAsync($"/api/incidents/{id}/measurements", Json("""{ "device": "CB-A1", "phaseCurrentA": 1880 }"""));
        var ranking = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/ranking");
        var plan = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/plan");

        Assert.Equal(HttpStatusCode.Accepted, posted.StatusCode);
        Assert.Equal(HttpStatusCode.Accepted, record.StatusCode);
        Assert.Equal("SEC-S108", ranking.GetProperty("sections")[0].GetProperty("id").GetString());
        Assert.Equal(1.0, ranking.GetProperty("sections").EnumerateArray().Sum(s => s.GetProperty("probability").GetDouble()), 1e-9);
        Assert.Equal("SEC-S108", plan.GetProperty("isolatedSections")[0].GetString());
        Assert.Contains(plan.GetProperty("steps").EnumerateArray(), s => s.GetProperty("action").GetString() == "proveDead");
    }

    [Fact]
    public async Task A_switch_whose_recorded_position_the_evidence_doubts_is_in_the_ranking_and_the_handover_until_recorded()
    {
        // The back-fed sample incident (sample-grid/README.md) without the tie's closing in the record.
        var body = """
            { "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "switchStates": { "LB-A1-4": "open" },
              "trippedDevice": "RC-B1-1", "faultType": "LL", "measurements": [ { "device": "CB-B1", "phaseCurrentA": 1346 } ],
              "indications": [ { "indicator": "FPI-B1-01", "state": "forward", "source": "remote" },
                               { "indicator": "FPI-B1-04", "state": "fault", "source": "remote" },
                               { "indicator": "FPI-A1-16", "state": "forward", "source": "remote" },
                               { "indicator": "FPI-A1-14", "state": "none", "source": "remote" },
                               { "indicator": "FPI-B1-11", "state": "forward", "source": "remote" },
                               { "indicator": "FPI-B1-14", "state": "none", "source": "remote" } ] }
            """;
        var opened = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(SolidGrid)}", Json(body));
        var id = (await opened.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("id").GetInt64();

        var ranking = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/ranking");
        var handover = await app.Client.GetFromJsonAsync<JsonElement>("/api/handover");

        var suspect = Assert.Single(ranking.GetProperty("switchSuspects").EnumerateArray().ToList());
        Assert.Equal(("NO-A1-B1", "closed"), (suspect.GetProperty("device").GetString(), suspect.GetProperty("state").GetString()));
        // Its probability (and so the verdict on consistency) moves with what the grid has learned from the
        // other tests' outcomes on the shared database; the Core tests check the numbers.
        var entry = handover.GetProperty("incidents").EnumerateArray().Single(i => i.GetProperty("id").GetInt64() == id);
        Assert.Equal("NO-A1-B1", Assert.Single(entry.GetProperty("switchSuspects").EnumerateArray().ToList()).GetProperty("device").GetString());

        var found = await app.Client.PostAsync($"/api/incidents/{id}/switches", Json("""{ "switch": "NO-A1-B1", "position": "closed" }"""));
        var again = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/ranking");

        Assert.Equal(HttpStatusCode.Accepted, found.StatusCode);
        Assert.Equal(0, again.GetProperty("switchSuspects").GetArrayLength());
    }

    [Fact]
    public async Task The_return_to_normal_is_read_after_the_plan_with_its_clearance_and_cautions()
    {
        var id = await OpenSolidTrip();
        await app.Client.PostAsync($"/api/incidents/{id}/indications", Json("""
            [ { "indicator": "FPI-A1-04", "state": "fault", "source": "remote" },
              { "indicator": "FPI-A1-11", "state": "forward", "source": "remote" },
              { "indicator": "FPI-A1-14", "state": "none", "source": "remote" } ]
            """));

        var plan = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/plan");
        var before = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/plan/return");
        // The clearance takes off what was put on: the plan carried out, its locks and earths ticked.
        foreach (var step in plan.GetProperty("steps").EnumerateArray().Select(s => s.GetProperty("order").GetInt32()))
        {
            var ticked = await app.Client.PostAsync($"/api/incidents/{id}/steps", Json($$"""{ "order": {{step}} }"""));
            Assert.Equal(System.Net.HttpStatusCode.Accepted, ticked.StatusCode);
        }

        var back = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/plan/return");

        Assert.Contains(plan.GetProperty("steps").EnumerateArray(), s => s.GetProperty("action").GetString() == "lock");
        Assert.Contains("from the curve", plan.GetProperty("coldLoadBasis").GetString(), StringComparison.Ordinal);
        var actions = back.GetProperty("steps").EnumerateArray().Select(s => s.GetProperty("action").GetString()).ToList();
        Assert.Contains("removeEarth", actions);
        Assert.DoesNotContain(before.GetProperty("steps").EnumerateArray(), s => s.GetProperty("action").GetString() is "removeEarth" or "unlock");
        Assert.True(actions.LastIndexOf("unlock") < actions.IndexOf("close"));
        Assert.Contains(back.GetProperty("cautions").EnumerateArray(), c => c.GetString()!.Contains("Advice only", StringComparison.Ordinal));
    }

    [Fact]
    public async Task The_plan_for_a_chosen_section_is_given_and_an_unknown_section_is_a_400()
    {
        var id = await OpenSolidTrip();

        var plan = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/plan?section=SEC-S108");
        var unknown = await app.Client.GetAsync($"/api/incidents/{id}/plan?section=SEC-NOPE");

        Assert.Equal("SEC-S108", plan.GetProperty("isolatedSections")[0].GetString());
        Assert.Equal(HttpStatusCode.BadRequest, unknown.StatusCode);
        Assert.Contains("SEC-NOPE", await unknown.Content.ReadAsStringAsync(), StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_bad_indication_is_a_400_naming_the_element_and_field_and_nothing_is_kept()
    {
        var id = await OpenSolidTrip();
        var batch = """
            [ { "indicator": "FPI-A1-01", "state": "forward", "source": "remote" },
              { "indicator": "FPI-A1-04", "state": "sideways", "source": "remote" } ]
            """;

        var response = await app.Client.PostAsync($"/api/incidents/{id}/indications", Json(batch));
        var incident = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}");

        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        var error = await response.Content.ReadFromJsonAsync<JsonElement>();
        var problem = error.GetProperty("problems")[0];
        Assert.Equal("indication", problem.GetProperty("elementKind").GetString());
        Assert.Equal("FPI-A1-04", problem.GetProperty("elementId").GetString());
        Assert.Equal("state", problem.GetProperty("field").GetString());
        Assert.Equal(1, incident.GetProperty("events").GetInt32());
    }

    [Fact]
    public async Task Opening_an_incident_on_an_unknown_grid_or_with_a_bad_body_is_a_400()
    {
        var unknownGrid = await app.Client.PostAsync("/api/incidents?grid=Nowhere", Json("{}"));
        var badBody = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(SolidGrid)}",
            Json("""{ "format": "feederlocate-incident/1", "reportedAt": "yesterday", "faultType": "LG", "indications": [] }"""));

        Assert.Equal(HttpStatusCode.BadRequest, unknownGrid.StatusCode);
        Assert.Equal(HttpStatusCode.BadRequest, badBody.StatusCode);
        var problem = (await badBody.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("problems")[0];
        Assert.Equal("reportedAt", problem.GetProperty("field").GetString());
    }

    [Fact]
    public async Task An_outcome_is_logged_and_an_unknown_segment_refused()
    {
        var id = await OpenSolidTrip();

        var bad = await app.Client.PostAsync($"/api/incidents/{id}/outcome", Json("""{ "segment": "S999" }"""));
        var good = await app.Client.PostAsync($"/api/incidents/{id}/outcome", Json("""{ "segment": "S109", "faultType": "LG", "cause": "tree contact" }"""));
        var incident = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}");

        Assert.Equal(HttpStatusCode.BadRequest, bad.StatusCode);
        Assert.Equal(HttpStatusCode.Accepted, good.StatusCode);
        Assert.Equal("S109", incident.GetProperty("confirmedSegment").GetString());
    }

    [Fact]
    public async Task The_learning_of_a_grid_gives_the_priors_chosen_from_its_history()
    {
        var id = await OpenSolidTrip();
        var logged = await app.Client.PostAsync($"/api/incidents/{id}/outcome", Json("""{ "segment": "S109", "faultType": "LG" }"""));

        var learning = await app.Client.GetFromJsonAsync<JsonElement>($"/api/learning?grid={Uri.EscapeDataString(SolidGrid)}");
        var unknown = await app.Client.GetAsync("/api/learning?grid=Nowhere");

        Assert.Equal(HttpStatusCode.Accepted, logged.StatusCode);
        Assert.Equal(SolidGrid, learning.GetProperty("grid").GetString());
        Assert.True(learning.GetProperty("outcomes").GetInt32() >= 1);
        // S109's line type has history, so its prior is chosen by the data, within the stated bounds.
        var s109 = learning.GetProperty("segments").EnumerateArray().Single(s => s.GetProperty("id").GetString() == "S109");
        Assert.True(s109.GetProperty("faults").GetInt32() >= 1);
        foreach (var type in learning.GetProperty("lineTypes").EnumerateArray().Where(t => t.GetProperty("faults").GetInt32() > 0))
        {
            Assert.True(type.GetProperty("chosenByData").GetBoolean());
            var bounds = type.GetProperty("boundsKmYears");
            Assert.InRange(type.GetProperty("strengthKmYears").GetDouble(), bounds[0].GetDouble(), bounds[1].GetDouble());
        }

        Assert.Contains(learning.GetProperty("lineTypes").EnumerateArray(), t => t.GetProperty("faults").GetInt32() > 0);
        Assert.NotEmpty(learning.GetProperty("indicatorKinds").EnumerateArray());
        Assert.Equal(SolidGrid, learning.GetProperty("measuredCurve").GetProperty("grid").GetString());
        Assert.Equal(HttpStatusCode.BadRequest, unknown.StatusCode);
    }

    [Fact]
    public async Task An_unknown_incident_is_a_404_and_an_oversized_body_is_refused()
    {
        var missing = await app.Client.GetAsync("/api/incidents/999999/ranking");
        var huge = await app.Client.PostAsync($"/api/incidents/{await OpenSolidTrip()}/indications", Json(new string(' ', 1_100_000) + "[]"));

        Assert.Equal(HttpStatusCode.NotFound, missing.StatusCode);
        Assert.Equal(HttpStatusCode.RequestEntityTooLarge, huge.StatusCode);
    }

    [Fact]
    public async Task The_app_serves_an_OpenAPI_document_describing_the_endpoints()
    {
        var document = await app.Client.GetFromJsonAsync<JsonElement>("/openapi/v1.json");

        var paths = document.GetProperty("paths").EnumerateObject().Select(p => p.Name).ToList();
        Assert.Contains("/api/incidents", paths);
        Assert.Contains("/api/incidents/{id}/indications", paths);
        Assert.Contains("/api/incidents/{id}/ranking", paths);
        Assert.Contains("/api/learning", paths);
        Assert.DoesNotContain(paths, p => p.StartsWith("/account", StringComparison.Ordinal));
        var scheme = document.GetProperty("components").GetProperty("securitySchemes").GetProperty("apiToken");
        Assert.Equal(("http", "bearer"), (scheme.GetProperty("type").GetString(), scheme.GetProperty("scheme").GetString()));
        Assert.True(document.GetProperty("security")[0].TryGetProperty("apiToken", out _));
    }

    [Fact]
    public async Task The_plan_and_the_return_name_the_crew_of_each_manual_step_on_a_grid_with_crews()
    {
        // The resistor-grounded sample grid names two crew bases of one crew each (sample-grid/README.md).
        var incident = RepositoryFiles.Read("sample-grid", "incidents", "impedance-lg-trip-a2.incident.json");
        var response = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString("Marrowdell 20 kV (resistor-grounded)")}", Json(incident));
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        using var created = JsonDocument.Parse(await response.Content.ReadAsStringAsync());
        var id = created.RootElement.GetProperty("id").GetInt64();

        var plan = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/plan");
        var steps = plan.GetProperty("steps").EnumerateArray().ToList();

        // Every open and close names a crew exactly when its device is manual; the remote ones name none.
        string[] crews = ["DEPOT-A/1", "DEPOT-B/1"];
        var grid = SampleGrids.Grid("impedance");
        var switching = steps.Where(s => s.GetProperty("action").GetString() is "open" or "close").ToList();
        Assert.NotEmpty(switching);
        foreach (var step in switching)
        {
            var remote = grid.Switch(new Core.Model.SwitchId(step.GetProperty("device").GetString()!)).Remote;
            Assert.Equal(!remote, step.TryGetProperty("crew", out var crew));
            Assert.True(remote || crews.Contains(crew.GetString()), $"step {step.GetProperty("order")}: crew {crew}");
        }

        Assert.Contains(steps, s => s.GetProperty("action").GetString() == "dispatch" && s.TryGetProperty("crew", out _));

        // Carried out, the plan leaves manual devices open: the return sends crews to close them.
        foreach (var step in steps.Select(s => s.GetProperty("order").GetInt32()))
        {
            var ticked = await app.Client.PostAsync($"/api/incidents/{id}/steps", Json($$"""{ "order": {{step}} }"""));
            Assert.Equal(HttpStatusCode.Accepted, ticked.StatusCode);
        }

        var back = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/plan/return");
        Assert.Contains(back.GetProperty("steps").EnumerateArray(), s => s.TryGetProperty("crew", out var c) && crews.Contains(c.GetString()));
    }
}
