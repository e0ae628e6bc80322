namespace FeederLocate.Cli.Tests.Commands;

public class FaultCommandTests
{
    /// <summary>Worked example of the reference model (shared/examples/README.md), first row; 0.5 % tolerance.</summary>
    [Fact]
    public void Fault_json_reproduces_the_isolated_worked_example()
    {
        var run = CliRun.Of("fault", SampleGrids.TinyFenPath("isolated"), "--segment", "S2", "--position", "0.5", "--type", "LG", "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.Equal(21.46, json.GetProperty("faultCurrentA").GetDouble(), 21.46 * 0.005);
        Assert.Equal(12790, json.GetProperty("neutralVoltageV").GetDouble(), 12790 * 0.005);
        var healthy = json.GetProperty("healthyPhaseVoltagesV").EnumerateArray().Select(v => v.GetDouble()).ToList();
        Assert.Equal(2, healthy.Count);
        Assert.Equal(22040, healthy[0], 22040 * 0.005);
        var indicators = json.GetProperty("indicators").EnumerateArray().ToDictionary(i => i.GetProperty("id").GetString()!);
        Assert.Equal("forward", indicators["FI2"].GetProperty("expected").GetString());
        Assert.Equal("fault", indicators["FI3"].GetProperty("expected").GetString());
        Assert.Equal(12.05, indicators["FI3"].GetProperty("residualCurrentA").GetDouble(), 12.05 * 0.005);
        Assert.True(indicators["FI1"].TryGetProperty("phaseCurrentA", out _));
    }

    [Fact]
    public void Short_circuit_gives_no_healthy_phase_voltages()
    {
        var run = CliRun.Of("fault", SampleGrids.TinyFenPath("solid"), "--segment", "S2", "--position", "1", "--type", "LLL", "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.Equal(0, json.GetProperty("healthyPhaseVoltagesV").GetArrayLength());
        Assert.Equal(2564, json.GetProperty("faultCurrentA").GetDouble(), 2564 * 0.005);
    }

    [Fact]
    public void Fault_reports_every_bad_option_at_once_and_exits_2()
    {
        var run = CliRun.Of("fault", SampleGrids.TinyFenPath("solid"), "--segment", "S9", "--type", "LX", "--position", "1.5", "--rf", "-3");

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--type must be LG, LL, LLG or LLL, got \"LX\"", run.Error, StringComparison.Ordinal);
        Assert.Contains("--position must be between 0 and 1", run.Error, StringComparison.Ordinal);
        Assert.Contains("--rf must be >= 0 ohm, got -3", run.Error, StringComparison.Ordinal);
        Assert.Contains("--segment \"S9\" is not a segment", run.Error, StringComparison.Ordinal);
        Assert.Equal(string.Empty, run.Out);
    }

    [Fact]
    public void Fault_uses_the_switch_states_of_an_incident_fed_through_a_tie()
    {
        // The LL incident opens LB-A1-4 and closes the tie NO-A1-B1: the tail of A1 is fed from B1.
        var incident = RepositoryFiles.Path("sample-grid", "incidents", "solid-ll-a1-tail-fed-from-b1.incident.json");
        var run = CliRun.Of("fault", SampleGrids.Path("solid"), "--segment", "S110", "--type", "LL", "--incident", incident, "--json");

        Assert.Equal(0, run.ExitCode);
        Assert.Equal("B", run.Json().GetProperty("substation").GetString());
    }

    [Fact]
    public void Fault_table_lists_every_indicator()
    {
        var run = CliRun.Of("fault", SampleGrids.TinyFenPath("resonant"), "--segment", "S2", "--type", "LG");

        Assert.Equal(0, run.ExitCode);
        Assert.Contains("FI1", run.Out, StringComparison.Ordinal);
        Assert.Contains("FI3", run.Out, StringComparison.Ordinal);
        Assert.Contains("neutral voltage", run.Out, StringComparison.Ordinal);
    }
}
