using System.Net;
using System.Net.Http.Json;
using System.Text;
using System.Text.Json;
using CsCheck;
using FeederLocate.Web.Services;
using FeederLocate.Web.Tests.Support;
using Microsoft.Extensions.DependencyInjection;

namespace FeederLocate.Web.Tests.Hardening;

/// <summary>
/// Mutated bodies posted to the API: never a server error; a refusal is a 4xx naming what is wrong and
/// changes nothing; an acceptance logs exactly what it says it accepted.
/// </summary>
public sealed class ApiFuzzTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    private const int MutantsPerEndpoint = 150;

    private static readonly string[] IndicationBodies =
    [
        """[ { "indicator": "FPI-A1-01", "state": "forward", "source": "remote", "readAt": "2026-11-30T06:12:30Z" }, { "indicator": "FPI-A1-04", "state": "fault", "source": "field", "suspect": true } ]""",
        """{ "indicator": "FPI-A1-14", "state": "none", "source": "remote" }""",
    ];

    private static readonly string[] MeasurementBodies =
    [
        """[ { "device": "CB-A1", "phaseCurrentA": 1880, "residualCurrentA": 35.5 }, { "device": "CB-B1", "neutralVoltageV": 0 } ]""",
        """{ "device": "CB-A1", "phaseCurrentA": 1880 }""",
    ];

    private static readonly string[] OutcomeBodies =
    [
        """{ "segment": "S109", "faultType": "LG", "cause": "tree contact", "notes": "crew found a branch on the line" }""",
    ];

    private static readonly string[] IncidentBodies =
    [
        """{ "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG", "indications": [ { "indicator": "FPI-A1-04", "state": "fault", "source": "remote" } ], "measurements": [ { "device": "CB-A1", "phaseCurrentA": 1880 } ] }""",
    ];

    private static StringContent Json(string text) => new(text, Encoding.UTF8, "application/json");

    private long OpenIncident()
    {
        var response = app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}", Json(IncidentBodies[0])).GetAwaiter().GetResult();
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        return response.Content.ReadFromJsonAsync<JsonElement>().GetAwaiter().GetResult().GetProperty("id").GetInt64();
    }

    private int EventCount(long id) =>
        app.Factory.Services.GetRequiredService<IncidentBoard>().Events(new Storage.Incidents.IncidentId(id)).Count;

    private int IncidentCount() => app.Factory.Services.GetRequiredService<IncidentBoard>().List().Count;

    [Theory]
    [InlineData("indications")]
    [InlineData("measurements")]
    [InlineData("outcome")]
    public void A_mutated_evidence_body_is_accepted_whole_or_refused_with_a_4xx_and_nothing_logged(string endpoint)
    {
        var bases = endpoint switch { "indications" => IndicationBodies, "measurements" => MeasurementBodies, _ => OutcomeBodies };
        var id = OpenIncident();
        var outcomes = new HashSet<HttpStatusCode>();

        Mutations.MutantGen(bases.Length).Sample(
            mutant =>
            {
                var before = EventCount(id);
                var response = app.Client.PostAsync($"/api/incidents/{id}/{endpoint}", Json(mutant.Apply(bases))).GetAwaiter().GetResult();
                var body = response.Content.ReadAsStringAsync().GetAwaiter().GetResult();
                var after = EventCount(id);
                outcomes.Add(response.StatusCode);

                Assert.True((int)response.StatusCode < 500, $"{(int)response.StatusCode}: {body}");
                if (response.StatusCode == HttpStatusCode.Accepted)
                {
                    Assert.Equal(JsonDocument.Parse(body).RootElement.GetProperty("accepted").GetInt32(), after - before);
                }
                else
                {
                    Assert.Equal(before, after);
                    Assert.True(JsonDocument.Parse(body).RootElement.GetProperty("problems").GetArrayLength() > 0, body);
                }
            },
            iter: MutantsPerEndpoint,
            threads: 1,
            print: m => Mutations.Describe(m, bases));

        // The mutants reached both sides: some were still good evidence, most were not.
        Assert.Contains(HttpStatusCode.Accepted, outcomes);
        Assert.Contains(HttpStatusCode.BadRequest, outcomes);
    }

    [Theory]
    [InlineData("indications", """{ "indicator": "FPI-A1-\ud800", "state": "fault", "source": "remote" }""")]
    [InlineData("measurements", """{ "device": "CB-A1\udc00", "phaseCurrentA": 1880 }""")]
    [InlineData("outcome", """{ "segment": "S109", "cause": "\ud800" }""")]
    public async Task A_lone_surrogate_in_a_body_is_a_400_not_a_server_error(string endpoint, string body)
    {
        // Found by the fuzzing above: the API's own handling of the body threw where the reader would have reported it.
        var id = OpenIncident();

        var response = await app.Client.PostAsync($"/api/incidents/{id}/{endpoint}", Json(body));

        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        Assert.Equal(1, EventCount(id));
    }

    [Fact]
    public void A_mutated_incident_opens_one_incident_or_is_refused_with_a_4xx_and_opens_none()
    {
        var outcomes = new HashSet<HttpStatusCode>();

        Mutations.MutantGen(IncidentBodies.Length).Sample(
            mutant =>
            {
                var before = IncidentCount();
                var response = app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}", Json(mutant.Apply(IncidentBodies))).GetAwaiter().GetResult();
                var body = response.Content.ReadAsStringAsync().GetAwaiter().GetResult();
                outcomes.Add(response.StatusCode);

                Assert.True((int)response.StatusCode < 500, $"{(int)response.StatusCode}: {body}");
                Assert.Equal(response.StatusCode == HttpStatusCode.Created ? before + 1 : before, IncidentCount());
            },
            iter: MutantsPerEndpoint,
            threads: 1,
            print: m => Mutations.Describe(m, IncidentBodies));

        Assert.Contains(HttpStatusCode.Created, outcomes);
        Assert.Contains(HttpStatusCode.BadRequest, outcomes);
    }
}
