namespace FeederLocate.Cli.Tests.Commands;

public class EvaluateCommandTests
{
    [Fact]
    public void Evaluate_json_reports_hit_rates_of_the_ranking_its_limit_and_the_baseline()
    {
        var run = CliRun.Of("evaluate", SampleGrids.Path("solid"), "--incidents", "30", "--seed", "3", "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var top1 = json.GetProperty("top1").GetDouble();
        var top3 = json.GetProperty("top3").GetDouble();
        Assert.InRange(top1, 0, 1);
        Assert.InRange(top3, top1, 1);
        foreach (var name in new[] { "limit", "baseline" })
        {
            var rates = json.GetProperty(name);
            var t1 = rates.GetProperty("top1").GetDouble();
            Assert.InRange(t1, 0, 1);
            Assert.InRange(rates.GetProperty("top3").GetDouble(), t1, 1);
        }

        // Present and a number; its value is the machine's, so it is not checked.
        Assert.True(json.GetProperty("msPerIncident").GetDouble() >= 0);
    }

    [Fact]
    public void Evaluate_with_the_same_seed_gives_the_same_rates()
    {
        string Rates(CliRun r)
        {
            var j = r.Json();
            return $"{j.GetProperty("top1")} {j.GetProperty("top3")} {j.GetProperty("limit")} {j.GetProperty("baseline")}";
        }

        var a = CliRun.Of("evaluate", SampleGrids.TinyFenPath("solid"), "--incidents", "20", "--seed", "9", "--json");
        var b = CliRun.Of("evaluate", SampleGrids.TinyFenPath("solid"), "--incidents", "20", "--seed", "9", "--json");

        Assert.Equal(0, a.ExitCode);
        Assert.Equal(Rates(a), Rates(b));
    }

    [Fact]
    public void Evaluate_rejects_a_miss_probability_above_one()
    {
        var run = CliRun.Of("evaluate", SampleGrids.Path("solid"), "--incidents", "30", "--seed", "3", "--miss", "2", "--json");

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--miss is a probability: 0 to 1", run.Error, StringComparison.Ordinal);
        Assert.Equal(string.Empty, run.Out);
    }
}
