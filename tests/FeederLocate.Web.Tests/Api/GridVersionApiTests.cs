using System.Net;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using FeederLocate.Core.Formats;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Api;

/// <summary>Grid versions through the API: loading with confirmation, versions, differences, the pin and the engineer's move.</summary>
public sealed class GridVersionApiTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    private static readonly string Name = Uri.EscapeDataString(TestGrids.BrackenfoldName);

    private static StringContent Json(string text) => new(text, Encoding.UTF8, "application/json");

    private HttpClient Engineer()
    {
        var name = $"eng-{Guid.NewGuid():N}"[..12];
        app.Accounts.CreateWithPassword(name, "Grid engineer", AccountRole.Engineer, "engineer-password-1", null, new Actor("admin", "engineer"));
        return app.ClientWith(app.Accounts.IssueToken(name, "desk", new Actor("admin", "engineer")).Secret);
    }

    private static async Task<JsonElement> Read(HttpResponseMessage response)
    {
        using var document = JsonDocument.Parse(await response.Content.ReadAsStringAsync());
        return document.RootElement.Clone();
    }

    [Fact]
    public async Task A_replacement_needs_confirmation_an_open_incident_stays_on_its_version_and_an_engineer_moves_it_with_a_reason()
    {
        var engineer = Engineer();
        var original = GridWriter.Write(TestGrids.Brackenfold());
        var edited = JsonNode.Parse(original)!.AsObject();
        edited["segments"]![2]!["lengthKm"] = 5.6;

        Assert.Equal(HttpStatusCode.Forbidden, (await app.Client.PostAsync("/api/grids", Json(original))).StatusCode);
        var first = await engineer.PostAsync("/api/grids?file=brackenfold.grid.json", Json(original));
        Assert.Equal(HttpStatusCode.Created, first.StatusCode);
        Assert.Equal(1, (await Read(first)).GetProperty("version").GetInt32());

        var opened = await app.Client.PostAsync($"/api/incidents?grid={Name}",
            Json("""{ "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB1", "faultType": "LG", "indications": [] }"""));
        Assert.Equal(HttpStatusCode.Created, opened.StatusCode);
        var id = (await Read(opened)).GetProperty("id").GetInt64();

        var unconfirmed = await engineer.PostAsync("/api/grids", Json(edited.ToJsonString()));
        var noReason = await engineer.PostAsync("/api/grids?replace=true", Json(edited.ToJsonString()));
        Assert.Equal(HttpStatusCode.Conflict, unconfirmed.StatusCode);
        var asked = await Read(unconfirmed);
        Assert.Equal("needsConfirmation", asked.GetProperty("outcome").GetString());
        Assert.Equal("S3", asked.GetProperty("difference").GetProperty("elements")[0].GetProperty("id").GetString());
        Assert.Equal(HttpStatusCode.Conflict, noReason.StatusCode);
        var replaced = await engineer.PostAsync("/api/grids?replace=true&reason=S3%20re-surveyed", Json(edited.ToJsonString()));
        Assert.Equal(HttpStatusCode.Created, replaced.StatusCode);
        Assert.Equal(2, (await Read(replaced)).GetProperty("version").GetInt32());

        var pin = await Read(await app.Client.GetAsync($"/api/incidents/{id}/grid"));
        Assert.Equal((1, 2), (pin.GetProperty("version").GetInt32(), pin.GetProperty("latest").GetInt32()));
        var versions = await Read(await app.Client.GetAsync($"/api/grids/{Name}/versions"));
        Assert.Equal([null, "S3 re-surveyed"], versions.EnumerateArray().Select(v => v.TryGetProperty("reason", out var r) ? r.GetString() : null));
        Assert.Equal([1, 2], versions.EnumerateArray().Select(v => v.GetProperty("version").GetInt32()));
        var difference = await Read(await app.Client.GetAsync($"/api/grids/{Name}/diff?from=1&to=2"));
        var change = Assert.Single(difference.GetProperty("elements").EnumerateArray());
        Assert.Equal(("segment", "S3", "changed", "lengthKm", "5", "5.6"), (
            change.GetProperty("kind").GetString(), change.GetProperty("id").GetString(), change.GetProperty("change").GetString(),
            change.GetProperty("fields")[0].GetProperty("field").GetString(), change.GetProperty("fields")[0].GetProperty("before").GetString(), change.GetProperty("fields")[0].GetProperty("after").GetString()));
        Assert.Equal(HttpStatusCode.NotFound, (await app.Client.GetAsync($"/api/grids/{Name}/diff?from=1&to=9")).StatusCode);

        var byOperator = await app.Client.PostAsync($"/api/incidents/{id}/grid", Json("""{ "version": 2, "reason": "newer" }"""));
        var noMoveReason = await engineer.PostAsync($"/api/incidents/{id}/grid", Json("""{ "version": 2 }"""));
        Assert.Equal(HttpStatusCode.UnprocessableEntity, byOperator.StatusCode);
        Assert.Equal(HttpStatusCode.UnprocessableEntity, noMoveReason.StatusCode);
        Assert.Equal(1, (await Read(await app.Client.GetAsync($"/api/incidents/{id}/grid"))).GetProperty("version").GetInt32());

        var moved = await engineer.PostAsync($"/api/incidents/{id}/grid", Json("""{ "version": 2, "reason": "S3 length corrected" }"""));
        Assert.Equal(HttpStatusCode.Accepted, moved.StatusCode);
        var after = await Read(await app.Client.GetAsync($"/api/incidents/{id}/grid"));
        Assert.Equal(2, after.GetProperty("version").GetInt32());
        Assert.Equal("S3 length corrected", after.GetProperty("moves")[0].GetProperty("reason").GetString());
        Assert.Equal(HttpStatusCode.OK, (await app.Client.GetAsync($"/api/incidents/{id}/ranking")).StatusCode);
    }
}
