using System.Text.Json;
using System.Text.Json.Nodes;
using FeederLocate.Core.Formats;

namespace FeederLocate.Cli.Tests.Hardening;

/// <summary>
/// Inputs the fuzz tests once found mishandled, each cut down to a small file: escaped lone surrogates made
/// the readers throw, a residual current of 1e308 made every probability NaN, an rOverX or --rf of -0
/// passed the checks and then failed a sign test (exit 1), and a null pickup counted as an element.
/// </summary>
public sealed class FuzzFindingTests
{
    public static TheoryData<string> LoneSurrogateGrids => new()
    {
        """{"format":"feederlocate-grid/1","name":"\uDC00"}""",
        """{"format":"feederlocate-grid/1","name":"a\uD800b"}""",
        """{"format":"feeder\uD800","name":"x"}""",
        """{"format":"feederlocate-grid/1","na\uD800me":"x"}""",
    };

    public static TheoryData<string> LoneSurrogateIncidents => new()
    {
        """{"format":"feederlocate-incident/1","reportedAt":"\uD800"}""",
        """{"format":"feederlocate-incident/1","switchStates":{"\uDC00":"open"}}""",
    };

    [Theory]
    [MemberData(nameof(LoneSurrogateGrids))]
    public void Grid_reader_reports_an_escaped_lone_surrogate(string json)
    {
        // A JSON escape of half a surrogate pair is valid syntax but no text.
        var result = GridReader.Parse(json);

        Assert.False(result.Succeeded);
        ReaderFuzzTests.AssertAcceptedCleanlyOrRejectedWithNamedErrors(result, ["grid"]);
    }

    [Theory]
    [MemberData(nameof(LoneSurrogateIncidents))]
    public void Incident_reader_reports_an_escaped_lone_surrogate(string json)
    {
        var result = IncidentReader.Parse(json, SampleFiles.Grids[0].Grid);

        Assert.False(result.Succeeded);
        ReaderFuzzTests.AssertAcceptedCleanlyOrRejectedWithNamedErrors(result, ["incident"]);
    }

    [Fact]
    public void Grid_reader_reports_text_holding_a_lone_surrogate_character()
    {
        // Not reachable from a file (decoding replaces it), but Parse takes any string.
        var result = GridReader.Parse("{\"format\":\"feederlocate-grid/1\",\"name\":\"\uD800\"}");

        Assert.False(result.Succeeded);
        ReaderFuzzTests.AssertAcceptedCleanlyOrRejectedWithNamedErrors(result, ["grid"]);
    }

    [Fact]
    public void Check_exits_2_on_a_grid_file_with_an_escaped_lone_surrogate()
    {
        var path = TempFile("grid", """{"format":"feederlocate-grid/1","name":"\uDC00"}""");
        try
        {
            var run = CliRun.Of("check", path, "--json");

            Assert.Equal(2, run.ExitCode);
            Assert.Contains(run.Error.Split('\n'), l => l.StartsWith("error:", StringComparison.Ordinal));
            Assert.False(run.Json().GetProperty("valid").GetBoolean());
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Theory]
    [InlineData("1e308")]
    [InlineData("1.7e308")]
    [InlineData("1e9")]
    public void Rank_of_a_huge_residual_current_is_rejected_or_gives_probabilities_summing_to_one(string residualCurrentA)
    {
        // Once every probability came out NaN (printed "NaN") with exit 0 for a residual current of 1e308.
        var path = TempFile("incident", $$"""
            {"format":"feederlocate-incident/1","reportedAt":"2026-02-11T06:47:00Z","trippedDevice":"CB-A1","faultType":"LG",
             "measurements":[{"device":"CB-A1","residualCurrentA":{{residualCurrentA}}}],"indications":[]}
            """);
        try
        {
            var run = CliRun.Of("rank", SampleGrids.Path("solid"), path, "--json");

            Assert.True(run.ExitCode is 0 or 2, $"exit {run.ExitCode}: {run.Error}");
            if (run.ExitCode == 0)
            {
                AssertProbabilitiesSumToOne(run.Json());
            }
            else
            {
                Assert.Contains(run.Error.Split('\n'), l => l.StartsWith("error:", StringComparison.Ordinal));
            }
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Theory]
    [InlineData("check")]
    [InlineData("fault")]
    [InlineData("rank")]
    public void A_grid_with_rOverX_negative_zero_exits_0_or_2_not_1(string command)
    {
        var sample = SampleFiles.Grids.Single(g => g.Scheme == "solid");
        const string Normal = "\"rOverX\": 0.1";
        var index = sample.Text.IndexOf(Normal, StringComparison.Ordinal);
        var path = TempFile("grid", string.Concat(sample.Text.AsSpan(0, index), "\"rOverX\": -0", sample.Text.AsSpan(index + Normal.Length)));
        try
        {
            string[] args = command switch
            {
                "check" => ["check", path, "--json"],
                "fault" => ["fault", path, "--segment", "S101", "--type", "LG"],
                _ => ["rank", path, SampleFiles.IncidentOn(sample).Path],
            };

            var run = CliRun.Of(args);

            Assert.True(run.ExitCode is 0 or 2, $"exit {run.ExitCode}: {run.Error}");
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Rank_of_an_incident_whose_grid_field_holds_a_null_character_exits_2_naming_the_field()
    {
        // The incident's grid field is a path; U+0000 can be written in JSON but no path may hold it.
        var text = File.ReadAllText(RepositoryFiles.Path("sample-grid", "incidents", "solid-lg-trip-a1.incident.json"));
        var node = JsonNode.Parse(text)!;
        node["grid"] = "\u0000";
        var path = TempFile("incident", node.ToJsonString());
        try
        {
            var run = CliRun.Of("rank", SampleGrids.Path("solid"), path);

            Assert.Equal(2, run.ExitCode);
            Assert.Equal(string.Empty, run.Out);
            Assert.Contains("incident file: grid must be a file path", run.Error, StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Fault_with_rf_negative_zero_exits_0_or_2_not_1()
    {
        var run = CliRun.Of("fault", SampleGrids.Path("solid"), "--segment", "S101", "--type", "LG", "--rf", "-0");

        Assert.True(run.ExitCode is 0 or 2, $"exit {run.ExitCode}: {run.Error}");
    }

    [Fact]
    public void Grid_reader_rejects_an_indicator_whose_only_pickup_is_null()
    {
        // FPI-A1-07 in the solid sample has an earth element only.
        var root = JsonNode.Parse(SampleFiles.Grids.Single(g => g.Scheme == "solid").Text)!.AsObject();
        var indicator = root["indicators"]!.AsArray().Single(i => (string?)i!["id"] == "FPI-A1-07")!.AsObject();
        Assert.False(indicator.ContainsKey("phasePickupA"));
        indicator["earthPickupA"] = null;

        var result = GridReader.Parse(root.ToJsonString());

        // A null pickup is no element; written back, the indicator would have none and not read.
        Assert.False(result.Succeeded);
        Assert.Contains(result.Errors, e => e.ElementKind == "indicator" && e.ElementId == "FPI-A1-07");
    }

    internal static void AssertProbabilitiesSumToOne(JsonElement ranking)
    {
        foreach (var list in new[] { "segments", "sections" })
        {
            var probabilities = ranking.GetProperty(list).EnumerateArray().Select(s => s.GetProperty("probability")).ToList();
            Assert.NotEmpty(probabilities);
            Assert.All(probabilities, p => Assert.Equal(JsonValueKind.Number, p.ValueKind));
            Assert.Equal(1.0, probabilities.Sum(p => p.GetDouble()), 1e-9);
        }
    }

    [Fact]
    public void Fault_prints_a_table_for_an_indicator_named_by_a_noncharacter()
    {
        // An id of U+FFFF (valid JSON, valid grid) made the table's width measure throw: exit 1, "internal error".
        var text = File.ReadAllText(SampleGrids.Path("solid")).Replace("\"id\": \"FPI-A1-04\"", "\"id\": \"\\uFFFF\"", StringComparison.Ordinal);
        Assert.Contains("\\uFFFF", text, StringComparison.Ordinal);
        var path = TempFile("grid", text);
        try
        {
            var run = CliRun.Of("fault", path, "--segment", "S101", "--type", "LG");

            Assert.Equal(0, run.ExitCode);
            Assert.Contains("\\uFFFF", run.Out, StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Check_reads_a_grid_file_that_starts_with_a_byte_order_mark()
    {
        // RFC 8259 §8.1: a parser may ignore a leading byte order mark; the command line skips it.
        var path = Path.Combine(Path.GetTempPath(), $"feederlocate-finding-{Guid.NewGuid():N}.grid.json");
        File.WriteAllBytes(path, [0xEF, 0xBB, 0xBF, .. File.ReadAllBytes(SampleGrids.Path("isolated"))]);
        try
        {
            var run = CliRun.Of("check", path, "--json");

            Assert.Equal(0, run.ExitCode);
            Assert.True(run.Json().GetProperty("valid").GetBoolean());
        }
        finally
        {
            File.Delete(path);
        }
    }

    private static string TempFile(string kind, string text)
    {
        var path = Path.Combine(Path.GetTempPath(), $"feederlocate-finding-{Guid.NewGuid():N}.{kind}.json");
        File.WriteAllText(path, text);
        return path;
    }
}
