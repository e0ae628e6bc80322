namespace FeederLocate.Cli.Tests.Commands;

/// <summary>
/// <c>bench --plan</c> reports, it asserts nothing; these tests check what it reports besides times: the grid's
/// crews and a digest of the plans that is the same on every run (no clock or thread enters the planner).
/// </summary>
public class BenchPlanTests
{
    private static CliRun Bench(params string[] extra) =>
        CliRun.Of(["bench", "--plan", "--segments", "300", "--rounds", "2", "--json", .. extra]);

    [Fact]
    public void The_plans_digest_is_the_same_on_every_run_and_follows_the_crews()
    {
        var first = Bench().Json();
        var second = Bench().Json();
        var withoutCrews = Bench("--crew-bases", "0").Json();

        Assert.True(first.GetProperty("repeatable").GetBoolean());
        Assert.Equal((2, 4), (first.GetProperty("crewBases").GetInt32(), first.GetProperty("crews").GetInt32()));
        Assert.Matches("^[0-9a-f]{64}$", first.GetProperty("plansSha256").GetString());
        Assert.Equal(first.GetProperty("plansSha256").GetString(), second.GetProperty("plansSha256").GetString());
        Assert.Equal(0, withoutCrews.GetProperty("crews").GetInt32());
        Assert.NotEqual(first.GetProperty("plansSha256").GetString(), withoutCrews.GetProperty("plansSha256").GetString());
    }

    [Fact]
    public void A_negative_number_of_crew_bases_is_refused()
    {
        var run = CliRun.Of("bench", "--plan", "--segments", "300", "--crew-bases", "-1");

        Assert.NotEqual(0, run.ExitCode);
        Assert.Contains("--crew-bases", run.Error, StringComparison.Ordinal);
    }
}
