using FeederLocate.LoadTest;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Load;

/// <summary>The load test's own run, short: correctness under concurrency, never speed.</summary>
public sealed class LoopbackLoadTests
{
    [Fact]
    public async Task Twenty_clients_for_five_seconds_get_no_errors_and_every_accepted_indication_is_logged_once()
    {
        var options = new LoadOptions(Clients: 20, Duration: TimeSpan.FromSeconds(5), Incidents: 5, GridFolder: Path.Combine(RepositoryFiles.Root, "sample-grid"));

        var report = await LoadRun.RunAsync(options, progress: null);

        Assert.True(report.ErrorCount == 0, string.Join("; ", report.Errors.Select(e => $"{e.Key} × {e.Value}")));
        Assert.True(report.Posts > 0 && report.AcceptedIndications > 0);
        Assert.True(report.RankingReads > 0);
        var log = report.Verification;
        Assert.True(log.Passed, string.Join(Environment.NewLine, log.Findings));
        Assert.Equal(0, log.Missing);
        Assert.Equal(0, log.Unexpected);
        Assert.Equal(0, log.Misattributed);
        Assert.Equal(log.Accepted, log.Logged);
        Assert.Equal(report.AcceptedIndications, report.IncidentsAfter.Sum(i => i.Events) - report.Incidents);
    }
}
