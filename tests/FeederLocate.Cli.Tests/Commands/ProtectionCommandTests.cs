using System.Text.Json;
using FeederLocate.Cli.Output;

namespace FeederLocate.Cli.Tests.Commands;

/// <summary>The protection context through the command line: rank's text and JSON, the grid check, evaluate --protection.</summary>
public class ProtectionCommandTests
{
    [Fact]
    public void Rank_json_lists_the_relay_assumption_and_no_transient_for_a_standing_earth_fault()
    {
        var run = CliRun.Of("rank", Sample("resonant"), Incident("resonant-standing-earth-fault-b1-with-relays"), "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.False(json.GetProperty("transient").GetBoolean());
        Assert.Contains(json.GetProperty("assumptions").EnumerateArray(), a => a.GetString()!.StartsWith("relays:", StringComparison.Ordinal));
        // CB-B1 forward: every suspect lies on feeder B1 (its segments are S3xx in the sample).
        Assert.All(json.GetProperty("sections").EnumerateArray().Take(3), s => Assert.StartsWith("SEC-S3", s.GetProperty("id").GetString(), StringComparison.Ordinal));
    }

    [Fact]
    public void Rank_says_a_successful_reclosure_is_transient_in_text_and_json()
    {
        var path = Temporary("""
            {
              "format": "feederlocate-incident/1",
              "reportedAt": "2026-02-11T06:47:00Z",
              "faultAt": "2026-02-11T06:45:10Z",
              "trippedDevice": null,
              "faultType": "LL",
              "reclosing": { "device": "RC-B1-1", "attempts": 1, "result": "success" },
              "indications": []
            }
            """);
        try
        {
            var json = CliRun.Of("rank", Sample("solid"), path, "--json");
            var text = CliRun.Of("rank", Sample("solid"), path);

            Assert.Equal(0, json.ExitCode);
            Assert.True(json.Json().GetProperty("transient").GetBoolean());
            Assert.Contains("TRANSIENT: a reclosure held", text.Out, StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Rank_refuses_an_incident_that_names_another_grid()
    {
        // The sample incident names ../marrowdell-resonant.grid.json; given the solid grid, rank must refuse it.
        var run = CliRun.Of("rank", Sample("solid"), Incident("resonant-standing-earth-fault-b1"), "--json");

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("incident file: grid names \"../marrowdell-resonant.grid.json\"", run.Error, StringComparison.Ordinal);
        Assert.Equal(string.Empty, run.Out);
    }

    [Theory]
    [InlineData(-0.04, "0.0")]
    [InlineData(0.04, "0.0")]
    [InlineData(-0.0, "0.0")]
    [InlineData(1.26, "+1.3")]
    [InlineData(-2.05, "-2.1")]
    public void A_deviation_that_rounds_to_zero_is_written_without_sign(double sigma, string text)
    {
        Assert.Equal(text, DeviationText.Sigma(sigma));
    }

    [Fact]
    public void Result_numbers_are_written_without_arithmetic_noise()
    {
        // 0.1 + 0.2 = 0.30000000000000004 in binary floating point; 12 significant digits print 0.3.
        var text = JsonSerializer.Serialize(new { value = 0.1 + 0.2, big = 15.700000000000001 }, Core.Formats.Documents.DocumentJson.Options);

        Assert.Contains("\"value\": 0.3", text, StringComparison.Ordinal);
        Assert.Contains("\"big\": 15.7", text, StringComparison.Ordinal);
        Assert.DoesNotContain("0000000", text, StringComparison.Ordinal);
    }

    [Fact]
    public void Evaluate_protection_reports_both_sides()
    {
        var run = CliRun.Of("evaluate", Sample("solid"), "--protection", "--incidents", "20", "--seed", "3", "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        foreach (var side in new[] { "withoutProtection", "withProtection" })
        {
            foreach (var rate in new[] { "sectionTop1", "sectionTop3", "segmentTop1", "segmentTop3" })
            {
                Assert.InRange(json.GetProperty(side).GetProperty(rate).GetDouble(), 0, 1);
            }
        }

        Assert.True(json.GetProperty("withProtection").GetProperty("sectionTop3").GetDouble() >= json.GetProperty("withProtection").GetProperty("sectionTop1").GetDouble());
    }

    private static string Temporary(string text)
    {
        var path = Path.Combine(Path.GetTempPath(), $"protection-{Guid.NewGuid():N}.incident.json");
        File.WriteAllText(path, text);
        return path;
    }

    private static string Incident(string name) => CliRun.Repo("sample-grid", "incidents", $"{name}.incident.json");

    private static string Sample(string scheme) => CliRun.Repo("sample-grid", $"marrowdell-{scheme}.grid.json");
}
