namespace FeederLocate.Cli.Tests.Commands;

public class PlanCommandTests
{
    private static string Incident(string name) => RepositoryFiles.Path("sample-grid", "incidents", name);

    [Fact]
    public void Plan_json_has_the_contract_fields_and_the_crew_steps()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--json");

        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Error);
        var json = run.Json();
        foreach (var field in new[] { "steps", "isolatedSections", "sections", "coldLoadFactor", "restoredCustomers", "unservedCustomers", "testOrder",
                     "voltageLimitPu", "customerMinutesInterrupted", "finalState", "cautions", "approximations" })
        {
            Assert.True(json.TryGetProperty(field, out _), $"missing {field}");
        }

        var steps = json.GetProperty("steps").EnumerateArray().ToList();
        Assert.Equal(Enumerable.Range(1, steps.Count), steps.Select(s => s.GetProperty("order").GetInt32()));
        var actions = steps.Select(s => s.GetProperty("action").GetString()).ToList();
        Assert.Contains("proveDead", actions);
        Assert.Contains("earth", actions);
        Assert.Contains("permit", actions);
        Assert.All(steps.Where(s => s.GetProperty("action").GetString() is "open" or "close"), s => Assert.True(s.TryGetProperty("device", out _)));
        Assert.Equal("SEC-S108", json.GetProperty("isolatedSections")[0].GetString());
        Assert.Equal(2.0, json.GetProperty("coldLoadFactor").GetDouble());
        Assert.Equal(0.9, json.GetProperty("voltageLimitPu").GetDouble());
        Assert.Contains(json.GetProperty("cautions").EnumerateArray(), c => c.GetString()!.Contains("prove dead", StringComparison.OrdinalIgnoreCase));
    }

    [Fact]
    public void Plan_table_prints_the_cautions_and_the_steps()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"));

        Assert.Equal(0, run.ExitCode);
        Assert.Contains("CAUTION: Advice only", run.Out, StringComparison.Ordinal);
        Assert.Contains("prove dead, earth on both sides, and issue a permit", run.Out, StringComparison.Ordinal);
        Assert.Contains("Local switching rules and licensed practice govern", run.Out, StringComparison.Ordinal);
        Assert.Contains("CB-A1", run.Out, StringComparison.Ordinal);
        Assert.Contains("proveDead", run.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Standing_earth_fault_plan_carries_the_u0_search()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("resonant"), Incident("resonant-standing-earth-fault-b1.incident.json"), "--json");

        Assert.Equal(0, run.ExitCode);
        var tests = run.Json().GetProperty("testOrder").EnumerateArray().ToList();
        Assert.NotEmpty(tests);
        Assert.Equal("openWatchingU0", tests[0].GetProperty("action").GetString());
        Assert.True(tests[0].TryGetProperty("ifU0Stays", out _));
        Assert.True(tests[0].TryGetProperty("ifU0Collapses", out _));
    }

    [Fact]
    public void Split_ranking_plan_carries_trial_closures_with_both_branches()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("impedance"), Incident("impedance-lg-trip-a2.incident.json"), "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var first = json.GetProperty("testOrder")[0];
        Assert.Equal("trialClose", first.GetProperty("action").GetString());
        Assert.Equal("CB-A2", first.GetProperty("device").GetString());
        Assert.True(first.TryGetProperty("energises", out _));
        Assert.True(first.TryGetProperty("ifHolds", out _));
        Assert.True(first.TryGetProperty("ifTrips", out _));
        Assert.InRange(json.GetProperty("expectedReenergisationsOntoFault").GetDouble(), 0, 1);
    }

    [Fact]
    public void Bad_options_are_all_reported_and_exit_2()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--cold-load-factor", "0.5", "--voltage-limit", "1.5");

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--cold-load-factor must be between 1 and 10, got 0.5", run.Error, StringComparison.Ordinal);
        Assert.Contains("--voltage-limit must be between 0.5 and 1 pu, got 1.5", run.Error, StringComparison.Ordinal);
        Assert.Equal(string.Empty, run.Out);
    }

    [Fact]
    public void Missing_incident_file_exits_2()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("no-such.incident.json"), "--json");

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("cannot read incident file", run.Error, StringComparison.Ordinal);
        Assert.Equal(string.Empty, run.Out);
    }

    [Fact]
    public void Voltage_limit_option_is_stated_in_the_plan()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--voltage-limit", "0.95", "--cold-load-factor", "1.5", "--json");

        Assert.Equal(0, run.ExitCode);
        Assert.Equal(0.95, run.Json().GetProperty("voltageLimitPu").GetDouble());
        Assert.Equal(1.5, run.Json().GetProperty("coldLoadFactor").GetDouble());
        Assert.True(run.Json().GetProperty("finalState").GetProperty("minimumVoltagePu").GetDouble() >= 0.95);
    }
}
