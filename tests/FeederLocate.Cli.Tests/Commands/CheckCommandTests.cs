namespace FeederLocate.Cli.Tests.Commands;

public class CheckCommandTests
{
    [Fact]
    public void Check_reports_counts_of_a_valid_grid_as_json()
    {
        var run = CliRun.Of("check", SampleGrids.Path("resonant"), "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.True(json.GetProperty("valid").GetBoolean());
        Assert.Equal(0, json.GetProperty("errors").GetArrayLength());
        Assert.Equal(48, json.GetProperty("segments").GetInt32());
        Assert.Equal(20, json.GetProperty("sections").GetInt32());
        Assert.Equal(18, json.GetProperty("indicators").GetInt32());
    }

    [Fact]
    public void Check_of_a_broken_grid_exits_2_with_every_error_named_by_element_and_field()
    {
        var path = Path.Combine(Path.GetTempPath(), $"broken-{Guid.NewGuid():N}.grid.json");
        var text = File.ReadAllText(SampleGrids.TinyFenPath("isolated"))
            .Replace("\"lengthKm\": 6.0", "\"lengthKm\": -1", StringComparison.Ordinal)
            .Replace("\"c0NfPerKm\": 250", "\"c0NfPerKm\": -250", StringComparison.Ordinal);
        File.WriteAllText(path, text);
        try
        {
            var run = CliRun.Of("check", path, "--json");

            Assert.Equal(2, run.ExitCode);
            var json = run.Json();
            Assert.False(json.GetProperty("valid").GetBoolean());
            var errors = json.GetProperty("errors").EnumerateArray().Select(e => e.GetProperty("text").GetString()).ToList();
            Assert.Contains("segment S2: lengthKm must be > 0, got -1", errors);
            Assert.Contains("lineType CAB-AL150: c0NfPerKm must be >= 0, got -250", errors);
            Assert.Contains("segment S2: lengthKm must be > 0, got -1", run.Error, StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Check_of_a_missing_file_exits_2()
    {
        var run = CliRun.Of("check", "/nonexistent/grid.json");

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("cannot read grid file", run.Error, StringComparison.Ordinal);
        Assert.Equal(string.Empty, run.Out);
    }

    [Fact]
    public void Check_table_names_each_substation_and_its_scheme()
    {
        var run = CliRun.Of("check", SampleGrids.Path("isolated"));

        Assert.Equal(0, run.ExitCode);
        Assert.Contains("48 segments in 20 sections, 18 indicators", run.Out, StringComparison.Ordinal);
        Assert.Contains("isolated", run.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Unknown_command_line_option_is_bad_input()
    {
        var run = CliRun.Of("check", SampleGrids.Path("solid"), "--no-such-option");

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--no-such-option", run.Error, StringComparison.Ordinal);
    }
}
