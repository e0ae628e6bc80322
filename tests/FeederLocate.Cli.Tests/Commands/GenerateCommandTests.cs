namespace FeederLocate.Cli.Tests.Commands;

public class GenerateCommandTests
{
    [Fact]
    public void Generated_grid_passes_check_and_has_the_asked_size()
    {
        var path = Path.Combine(Path.GetTempPath(), $"generated-{Guid.NewGuid():N}.grid.json");
        try
        {
            var generate = CliRun.Of("generate", "--segments", "300", "--seed", "7", "--scheme", "isolated", "--output", path);
            var check = CliRun.Of("check", path, "--json");

            Assert.Equal(0, generate.ExitCode);
            Assert.Equal(0, check.ExitCode);
            Assert.Equal(300, check.Json().GetProperty("segments").GetInt32());
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Same_seed_gives_the_same_grid_and_another_seed_another()
    {
        var a = CliRun.Of("generate", "--segments", "50", "--seed", "3");
        var b = CliRun.Of("generate", "--segments", "50", "--seed", "3");
        var c = CliRun.Of("generate", "--segments", "50", "--seed", "4");

        Assert.Equal(a.Out, b.Out);
        Assert.NotEqual(a.Out, c.Out);
    }

    [Fact]
    public void Generate_rejects_a_bad_scheme_and_writes_nothing()
    {
        var path = Path.Combine(Path.GetTempPath(), $"never-{Guid.NewGuid():N}.grid.json");
        var run = CliRun.Of("generate", "--segments", "10", "--scheme", "grounded", "--output", path);

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--scheme must be", run.Error, StringComparison.Ordinal);
        Assert.False(File.Exists(path));
    }

    [Fact]
    public void Bench_reports_its_measures_as_json()
    {
        var run = CliRun.Of("bench", "--segments", "200", "--rounds", "1", "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        Assert.Equal(200, json.GetProperty("segments").GetInt32());
        Assert.Equal(600, json.GetProperty("faults").GetInt64());
        Assert.True(json.GetProperty("pickedUpReadings").GetInt64() > 0);
    }
}
