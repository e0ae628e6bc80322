using System.Net;
using System.Net.Http.Json;
using System.Text;
using System.Text.Json;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Api;

public sealed class SwitchesApiTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    private static StringContent Json(string text) => new(text, Encoding.UTF8, "application/json");

    [Fact]
    public async Task Switches_gives_the_tripped_device_open_until_a_ticked_step_closes_it()
    {
        var opened = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}",
            Json("""{ "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG", "indications": [] }"""));
        var id = (await opened.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("id").GetInt64();

        var tripped = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/switches");
        var board = Microsoft.Extensions.DependencyInjection.ServiceProviderServiceExtensions.GetRequiredService<Services.IncidentBoard>(app.Factory.Services);
        board.Record(new Storage.Incidents.IncidentId(id), new Storage.Events.PlanStepCompleted(1, "close", "CB-A1"), new Storage.Events.Actor("ana", "operator"));
        var closed = await app.Client.GetFromJsonAsync<JsonElement>($"/api/incidents/{id}/switches");
        var missing = await app.Client.GetAsync("/api/incidents/987654/switches");

        Assert.Equal(HttpStatusCode.Created, opened.StatusCode);
        Assert.Equal("open", tripped.GetProperty("positions").GetProperty("CB-A1").GetString());
        Assert.Equal(["CB-A1"], tripped.GetProperty("deviations").EnumerateObject().Select(p => p.Name));
        Assert.Equal("closed", closed.GetProperty("positions").GetProperty("CB-A1").GetString());
        Assert.Empty(closed.GetProperty("deviations").EnumerateObject());
        Assert.Equal(HttpStatusCode.NotFound, missing.StatusCode);
    }
}
