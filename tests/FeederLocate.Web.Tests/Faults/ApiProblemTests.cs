using System.Net;
using System.Net.Http.Headers;
using System.Text;
using System.Text.Json;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Faults;

/// <summary>Every API error is a problem document, never a page; a body over the limit is 413 however it is sent.</summary>
public sealed class ApiProblemTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    private static StringContent Json(string text) => new(text, Encoding.UTF8, "application/json");

    [Fact]
    public async Task An_unknown_path_a_missing_token_and_a_viewer_posting_get_problem_documents()
    {
        var opened = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}",
            Json("""{ "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG", "indications": [] }"""));
        Assert.Equal(HttpStatusCode.Created, opened.StatusCode);
        using var created = JsonDocument.Parse(await opened.Content.ReadAsStringAsync());
        var id = created.RootElement.GetProperty("id").GetInt64();
        var answers = new[]
        {
            (HttpStatusCode.NotFound, await app.Client.GetAsync("/api/no-such-thing")),
            (HttpStatusCode.Unauthorized, await app.Anonymous.GetAsync("/api/incidents")),
            (HttpStatusCode.Forbidden, await app.ClientWith(app.ViewerToken).PostAsync("/api/incidents?grid=x", Json("{}"))),
            (HttpStatusCode.NotFound, await app.Client.GetAsync("/api/incidents/987654")),
            (HttpStatusCode.BadRequest, await app.Client.PostAsync($"/api/incidents/{id}/indications", Json("{ not json"))),
        };

        foreach (var (status, answer) in answers)
        {
            await AssertProblem(answer, status);
        }
    }

    [Theory]
    [InlineData(true)]
    [InlineData(false)]
    public async Task A_body_over_1_MB_is_413_with_or_without_a_length(bool chunked)
    {
        var body = "[" + string.Join(",", Enumerable.Repeat("""{ "indicator": "FPI-A1-04", "state": "fault", "source": "remote" }""", 20_000)) + "]";
        HttpContent content = chunked
            ? new StreamContent(new MemoryStream(Encoding.UTF8.GetBytes(body)))
            : Json(body);
        content.Headers.ContentType = new MediaTypeHeaderValue("application/json");
        if (chunked)
        {
            content.Headers.ContentLength = null;
        }

        using var request = new HttpRequestMessage(HttpMethod.Post, "/api/incidents/1/indications") { Content = content };
        request.Headers.TransferEncodingChunked = chunked;
        var answer = await app.Client.SendAsync(request);

        Assert.True(Encoding.UTF8.GetByteCount(body) > 1_000_000);
        await AssertProblem(answer, HttpStatusCode.RequestEntityTooLarge);
    }

    [Fact]
    public async Task An_incident_whose_switch_states_close_a_loop_is_refused_and_nothing_is_logged()
    {
        var before = (await app.Client.GetStringAsync("/api/incidents")).Length;
        // The sample grid's tie NO-A1-B1 closed with LB-A1-4 closed too: feeders A1 and B1 in parallel.
        var body = """
            { "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG",
              "switchStates": { "NO-A1-B1": "closed" }, "indications": [] }
            """;

        var answer = await app.Client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}", Json(body));

        var text = await AssertProblem(answer, HttpStatusCode.UnprocessableEntity);
        Assert.Contains("radial operation only", text, StringComparison.Ordinal);
        Assert.Contains("NO-A1-B1", text, StringComparison.Ordinal);
        Assert.Equal(before, (await app.Client.GetStringAsync("/api/incidents")).Length);
    }

    internal static async Task<string> AssertProblem(HttpResponseMessage answer, HttpStatusCode status)
    {
        var text = await answer.Content.ReadAsStringAsync();
        Assert.True(status == answer.StatusCode, $"{answer.RequestMessage?.RequestUri}: expected {status}, got {answer.StatusCode}: {text}");
        Assert.Equal("application/problem+json", answer.Content.Headers.ContentType?.MediaType);
        Assert.DoesNotContain("<html", text, StringComparison.OrdinalIgnoreCase);
        using var document = JsonDocument.Parse(text);
        Assert.False(string.IsNullOrWhiteSpace(document.RootElement.GetProperty("title").GetString()));
        return text;
    }
}
