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
        Assert.InRange(json.GetProperty("coldLoadFactor").GetDouble(), 1.5, 2.5);
        Assert.Contains("from the curve", json.GetProperty("coldLoadBasis").GetString(), StringComparison.Ordinal);
        Assert.Equal(4, json.GetProperty("coldLoadCurve").GetArrayLength());
        Assert.Equal(0.9, json.GetProperty("voltageLimitPu").GetDouble());
        Assert.Contains(json.GetProperty("cautions").EnumerateArray(), c => c.GetString()!.Contains("prove dead", StringComparison.OrdinalIgnoreCase));
    }

    [Fact]
    public void Plan_lists_lock_steps_and_field_reads_before_the_earths_and_closes()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--json");

        var actions = run.Json().GetProperty("steps").EnumerateArray().Select(s => s.GetProperty("action").GetString()).ToList();
        Assert.Contains("lock", actions);
        Assert.True(actions.LastIndexOf("lock") < actions.IndexOf("earth"));
    }

    [Fact]
    public void Plan_return_gives_the_return_to_normal_with_clearance_first_and_the_cautions()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--return", "--json");

        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Error);
        var json = run.Json();
        var steps = json.GetProperty("steps").EnumerateArray().ToList();
        var actions = steps.Select(s => s.GetProperty("action").GetString()).ToList();
        Assert.Contains("removeEarth", actions);
        Assert.Contains("unlock", actions);
        Assert.True(actions.LastIndexOf("removeEarth") < actions.IndexOf("close"));

        // The ties the plan closed open again (normally open points restored).
        Assert.Contains(steps, s => s.GetProperty("action").GetString() == "open" && s.GetProperty("device").GetString() == "NO-A1-B1");
        Assert.True(json.GetProperty("customerMinutesInterrupted").GetDouble() >= 0);
        Assert.Contains(json.GetProperty("cautions").EnumerateArray(), c => c.GetString()!.Contains("Advice only", StringComparison.Ordinal));

        var table = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--return");
        Assert.Equal(0, table.ExitCode);
        // The section by the operators' name (feeder and bounding devices), its id after it.
        Assert.Contains("Return to normal after the repair of A1: LB-A1-3 → LB-A1-4, DS-A1-5 (SEC-S108)", table.Out, StringComparison.Ordinal);
        Assert.Contains("CAUTION: Advice only", table.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Standing_earth_fault_with_a_split_ranking_is_searched_first_and_the_found_section_is_planned_with_section()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("resonant"), Incident("resonant-standing-earth-fault-b1.incident.json"), "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.True(json.GetProperty("searchFirst").GetBoolean());
        Assert.True(json.GetProperty("expectedCustomerInterruptions").GetDouble() > 0);
        Assert.Contains("search first", json.GetProperty("steps")[0].GetProperty("reason").GetString(), StringComparison.Ordinal);

        // The sample's fault is on S310 (sample-grid/README.md): once the search ends there, the plan for its section.
        var found = CliRun.Of("plan", SampleGrids.Path("resonant"), Incident("resonant-standing-earth-fault-b1.incident.json"), "--section", "SEC-S310", "--json");
        Assert.Equal(0, found.ExitCode);
        Assert.Equal("SEC-S310", found.Json().GetProperty("isolatedSections")[0].GetString());

        var unknown = CliRun.Of("plan", SampleGrids.Path("resonant"), Incident("resonant-standing-earth-fault-b1.incident.json"), "--section", "SEC-NOPE");
        Assert.Equal(2, unknown.ExitCode);
        Assert.Contains("SEC-NOPE", unknown.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void Cross_country_fault_isolates_both_sections_of_the_pair()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("isolated"), Incident("isolated-cross-country-a1-a2.incident.json"), "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.Equal(["SEC-S105", "SEC-S206"], json.GetProperty("isolatedSections").EnumerateArray().Select(s => s.GetString()!).Order());
        Assert.Contains(json.GetProperty("approximations").EnumerateArray(), a => a.GetString()!.Contains("cross-country", StringComparison.Ordinal));
    }

    [Fact]
    public void Plan_table_prints_the_cautions_and_the_steps()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"));

        Assert.Equal(0, run.ExitCode);
        Assert.Contains("CAUTION: Advice only", run.Out, StringComparison.Ordinal);
        Assert.Contains("lock and tag every isolation point open, prove dead, earth on both sides, and issue a permit", run.Out, StringComparison.Ordinal);
        Assert.Contains("Local switching rules and licensed practice govern", run.Out, StringComparison.Ordinal);
        Assert.Contains("CB-A1", run.Out, StringComparison.Ordinal);
        // Actions in plain words in the text; the JSON keeps the format's action names.
        Assert.Contains("prove dead", run.Out, StringComparison.Ordinal);
        Assert.DoesNotContain("proveDead", run.Out, StringComparison.Ordinal);
        Assert.Contains("Isolate A1: LB-A1-3 → LB-A1-4, DS-A1-5 (SEC-S108)", run.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Plan_table_writes_a_test_entry_s_steps_on_lines_of_their_own()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("impedance"), Incident("impedance-lg-trip-a2.incident.json"));

        Assert.Equal(0, run.ExitCode);
        Assert.Contains("Test order:", run.Out, StringComparison.Ordinal);
        Assert.DoesNotContain("\\u000A", run.Out, StringComparison.Ordinal);
        Assert.Matches(@"customer minutes interrupted \(IEEE 1366 CMI\)\s+about \d{1,3}(,\d{3})*\s", run.Out);
    }

    [Fact]
    public void Standing_earth_fault_plan_carries_the_u0_search()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("resonant"), Incident("resonant-standing-earth-fault-b1.incident.json"), "--json");

        Assert.Equal(0, run.ExitCode);
        var tests = run.Json().GetProperty("testOrder").EnumerateArray().ToList();
        Assert.NotEmpty(tests);
        Assert.Equal("neutralVoltage", tests[0].GetProperty("observe").GetString());
        Assert.Equal("open", tests[0].GetProperty("steps")[0].GetProperty("action").GetString());
        var results = tests[0].GetProperty("branches").EnumerateArray().Select(b => b.GetProperty("result").GetString()).ToList();
        Assert.Equal(["u0Stays", "u0Collapses"], results);
    }

    [Fact]
    public void Split_ranking_plan_carries_trial_closures_with_both_branches()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("impedance"), Incident("impedance-lg-trip-a2.incident.json"), "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var first = json.GetProperty("testOrder")[0];
        Assert.Equal(1, first.GetProperty("entry").GetInt32());
        Assert.Equal("trip", first.GetProperty("observe").GetString());
        var steps = first.GetProperty("steps").EnumerateArray().ToList();
        Assert.Equal("close", steps[^1].GetProperty("action").GetString());
        Assert.Equal("CB-A2", steps[^1].GetProperty("device").GetString());
        Assert.True(first.TryGetProperty("reenergisesSections", out _));
        Assert.InRange(first.GetProperty("faultProbability").GetDouble(), 0, 1);
        var branches = first.GetProperty("branches").EnumerateArray().ToList();
        Assert.Equal(["holds", "trips"], branches.Select(b => b.GetProperty("result").GetString()));
        Assert.True(branches[0].TryGetProperty("faultIn", out _));
        Assert.True(branches[0].TryGetProperty("next", out _));
        Assert.InRange(json.GetProperty("expectedReenergisationsOntoFault").GetDouble(), 0, 1);
    }

    [Fact]
    public void Transient_fault_plan_isolates_nothing_and_patrols()
    {
        var run = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-transient-a1.incident.json"), "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.Empty(json.GetProperty("isolatedSections").EnumerateArray());
        var actions = json.GetProperty("steps").EnumerateArray().Select(s => s.GetProperty("action").GetString()).ToList();
        Assert.DoesNotContain("open", actions);
        Assert.DoesNotContain("close", actions);
        Assert.Contains("patrol", actions);
        Assert.Equal(0, json.GetProperty("unservedCustomers").GetInt32());
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

    [Fact]
    public void Plan_names_the_crew_of_each_step_where_the_grid_names_its_crews()
    {
        // The resistor-grounded sample names two crew bases of one crew each (sample-grid/README.md).
        var json = CliRun.Of("plan", SampleGrids.Path("impedance"), Incident("impedance-lg-trip-a2.incident.json"), "--json").Json();
        var text = CliRun.Of("plan", SampleGrids.Path("impedance"), Incident("impedance-lg-trip-a2.incident.json"));

        var steps = json.GetProperty("steps").EnumerateArray().ToList();
        var lb = steps.Single(s => s.GetProperty("action").GetString() == "open" && s.GetProperty("device").GetString() == "LB-A2-3");
        // LB-A2-3: 20 min from DEPOT-A (the device's own travelMinutes), 45 from DEPOT-B: DEPOT-A's crew, there at 20, done at 25.
        Assert.Equal("DEPOT-A/1", lb.GetProperty("crew").GetString());
        Assert.Equal(25, lb.GetProperty("atMinutes").GetDouble());
        Assert.All(steps.Where(s => s.GetProperty("action").GetString() is "open" or "close" && s.GetProperty("device").GetString()!.StartsWith("CB-", StringComparison.Ordinal)),
            s => Assert.False(s.TryGetProperty("crew", out _)));
        Assert.Matches(@"order\s+at min\s+crew\s+action\s+device\s+reason", text.Out);
        Assert.Contains("DEPOT-A/1", text.Out, StringComparison.Ordinal);
        Assert.Contains("control room", text.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Plan_without_crews_in_the_grid_has_no_crew_column_and_no_crew_field()
    {
        var json = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--json").Json();
        var text = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"));

        Assert.All(json.GetProperty("steps").EnumerateArray(), s => Assert.False(s.TryGetProperty("crew", out _)));
        Assert.Matches(@"order\s+at min\s+action\s+device\s+reason", text.Out);
    }
}
