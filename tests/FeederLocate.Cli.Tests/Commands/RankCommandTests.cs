using System.Text.Json;

namespace FeederLocate.Cli.Tests.Commands;

public class RankCommandTests
{
    public static TheoryData<string> SampleIncidents => new()
    {
        "impedance-lg-trip-a2",
        "isolated-cross-country-both-a-feeders",
        "isolated-standing-earth-fault-a2",
        "resonant-standing-earth-fault-b1",
        "solid-lg-trip-a1",
        "solid-ll-a1-tail-fed-from-b1",
        "solid-lll-a1-wrong-indication",
    };

    [Theory]
    [MemberData(nameof(SampleIncidents))]
    public void Rank_json_gives_segments_and_sections_sorted_and_summing_to_one(string name)
    {
        var run = Rank(name);

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.True(json.GetProperty("consistent").ValueKind is JsonValueKind.True or JsonValueKind.False);

        var segments = json.GetProperty("segments").EnumerateArray().ToList();
        Assert.NotEmpty(segments);
        Assert.All(segments, s => Assert.False(string.IsNullOrEmpty(s.GetProperty("id").GetString())));
        AssertDistribution(segments.Select(s => s.GetProperty("probability").GetDouble()).ToList());

        var sections = json.GetProperty("sections").EnumerateArray().ToList();
        Assert.NotEmpty(sections);
        Assert.All(sections, s =>
        {
            Assert.StartsWith("SEC-", s.GetProperty("id").GetString(), StringComparison.Ordinal);
            Assert.NotEqual(0, s.GetProperty("segments").GetArrayLength());
        });
        AssertDistribution(sections.Select(s => s.GetProperty("probability").GetDouble()).ToList());

        // Every ranked segment belongs to exactly one listed section.
        var members = sections.SelectMany(s => s.GetProperty("segments").EnumerateArray().Select(x => x.GetString())).ToList();
        Assert.Equal(members.Count, members.Distinct().Count());
        Assert.All(segments, s => Assert.Contains(s.GetProperty("id").GetString(), members));
    }

    [Fact]
    public void Rank_puts_the_section_of_the_intended_fault_first_for_the_solid_trip_on_a1()
    {
        // sample-grid/README.md: the incident was worked for an LG fault on S109 at 0.4 with Rf 2 Ω.
        var json = Rank("solid-lg-trip-a1").Json();

        var first = json.GetProperty("sections")[0];
        Assert.Contains("S109", first.GetProperty("segments").EnumerateArray().Select(s => s.GetString()));
        Assert.True(json.GetProperty("consistent").GetBoolean());
    }

    [Fact]
    public void Rank_table_names_the_first_section()
    {
        var run = CliRun.Of("rank", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1"));

        Assert.Equal(0, run.ExitCode);
        Assert.Contains("SEC-S108", run.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Rank_reports_a_cross_country_pair_in_json_and_text_and_does_not_call_it_consistent()
    {
        // sample-grid/README.md: worked as two bolted earth faults, at the middles of S105 (feeder A1) and
        // S206 (feeder A2), the loop current about 3650 A at c = 1.0 (the loop of CrossCountryRanking).
        var json = Rank("isolated-cross-country-both-a-feeders").Json();

        Assert.False(json.GetProperty("consistent").GetBoolean());
        var cross = json.GetProperty("crossCountry");
        Assert.InRange(cross.GetProperty("probability").GetDouble(), 0.5, 1);
        var top = cross.GetProperty("pairs")[0];
        Assert.Equal(["SEC-S105", "SEC-S206"], top.GetProperty("sections").EnumerateArray().Select(s => s.GetString()).Order());
        Assert.Equal(2, top.GetProperty("segments").GetArrayLength());

        var text = CliRun.Of("rank", SampleGrids.Path("isolated"), Incident("isolated-cross-country-both-a-feeders"));
        Assert.Equal(0, text.ExitCode);
        Assert.Contains("CROSS-COUNTRY: no single fault explains the evidence", text.Out, StringComparison.Ordinal);
        Assert.Matches(@"S10[5-7] \(SEC-S105\) \+ S20[6-8] \(SEC-S206\)|S20[6-8] \(SEC-S206\) \+ S10[5-7] \(SEC-S105\)", text.Out);
    }

    [Fact]
    public void Rank_of_a_single_fault_has_no_cross_country_field()
    {
        var json = Rank("isolated-standing-earth-fault-a2").Json();

        Assert.False(json.TryGetProperty("crossCountry", out _));
    }

    [Fact]
    public void Rank_of_a_bad_incident_exits_2_naming_each_element_and_field()
    {
        var path = Path.Combine(Path.GetTempPath(), $"bad-{Guid.NewGuid():N}.incident.json");
        File.WriteAllText(path, """
            {
              "format": "feederlocate-incident/1",
              "reportedAt": "2026-02-11T06:47:00Z",
              "trippedDevice": "CB-A1",
              "faultType": "LG",
              "indications": [
                { "indicator": "FPI-A1-99", "state": "fault", "source": "remote" },
                { "indicator": "FPI-A1-04", "state": "tripped", "source": "remote" }
              ]
            }
            """);
        try
        {
            var run = CliRun.Of("rank", SampleGrids.Path("solid"), path, "--json");

            Assert.Equal(2, run.ExitCode);
            Assert.Contains("indication FPI-A1-99: indicator refers to unknown indicator \"FPI-A1-99\"", run.Error, StringComparison.Ordinal);
            Assert.Contains("indication FPI-A1-04: state must be one of", run.Error, StringComparison.Ordinal);
            Assert.Equal(string.Empty, run.Out);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Rank_names_a_switch_whose_recorded_position_does_not_fit_in_text_and_json()
    {
        // The back-fed sample incident with the tie's closing left out of the record (sample-grid/README.md).
        var document = System.Text.Json.Nodes.JsonNode.Parse(File.ReadAllText(Incident("solid-ll-a1-tail-fed-from-b1")))!.AsObject();
        document["switchStates"]!.AsObject().Remove("NO-A1-B1");
        document.Remove("grid");
        var path = Path.Combine(Path.GetTempPath(), $"untold-tie-{Guid.NewGuid():N}.incident.json");
        File.WriteAllText(path, document.ToJsonString());
        try
        {
            var json = CliRun.Of("rank", SampleGrids.Path("solid"), path, "--json").Json();
            var suspect = Assert.Single(json.GetProperty("switchSuspects").EnumerateArray().ToList());
            Assert.Equal("NO-A1-B1", suspect.GetProperty("device").GetString());
            Assert.Equal("closed", suspect.GetProperty("state").GetString());
            Assert.InRange(suspect.GetProperty("probability").GetDouble(), 0.5, 1);
            Assert.False(json.GetProperty("consistent").GetBoolean());

            var table = CliRun.Of("rank", SampleGrids.Path("solid"), path);
            Assert.Equal(0, table.ExitCode);
            Assert.Contains("SWITCH POSITION: NO-A1-B1 is probably closed (", table.Out, StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Rank_json_lists_no_switch_suspect_where_the_recorded_positions_fit()
    {
        var json = Rank("solid-ll-a1-tail-fed-from-b1").Json();

        Assert.Equal(0, json.GetProperty("switchSuspects").GetArrayLength());
    }

    private static CliRun Rank(string name)
    {
        var scheme = name.Split('-')[0];
        return CliRun.Of("rank", SampleGrids.Path(scheme), Incident(name), "--json");
    }

    private static string Incident(string name) => SampleGrids.IncidentPath(name);

    private static void AssertDistribution(List<double> p)
    {
        Assert.Equal(1, p.Sum(), 1e-9);
        Assert.All(p, x => Assert.InRange(x, 0, 1));
        for (var i = 1; i < p.Count; i++)
        {
            Assert.True(p[i] <= p[i - 1], $"#{i} {p[i]} above #{i - 1} {p[i - 1]}");
        }
    }
}
