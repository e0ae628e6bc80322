using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.LoadTest;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;

namespace FeederLocate.Web.Tests.Load;

public sealed class LogVerificationTests : IDisposable
{
    private static readonly DateTimeOffset ReportedAt = new(2026, 11, 30, 6, 12, 0, TimeSpan.Zero);
    private readonly TempDatabase _db = new("incidents.db");

    private string DatabasePath => _db.Path;

    private static Indication Reading(string indicator, int second) =>
        new(new IndicatorId(indicator), IndicatorState.Fault, IndicationSource.Remote, ReportedAt.AddSeconds(second));

    [Fact]
    public void Every_accepted_indication_logged_once_by_its_account_passes()
    {
        var (id, logged) = Log([(Reading("FPI-1", 1), "loadtest"), (Reading("FPI-2", 2), "loadtest")]);

        var result = LogVerification.Verify(DatabasePath, [id], [.. logged.Select(i => new AcceptedIndication(id, i))], "loadtest");

        Assert.True(result.Passed, string.Join(Environment.NewLine, result.Findings));
        Assert.Equal(2, result.Logged);
    }

    [Fact]
    public void A_lost_an_unaccepted_and_a_misattributed_indication_are_each_found()
    {
        var lost = Reading("FPI-3", 3);
        var (id, logged) = Log([(Reading("FPI-1", 1), "loadtest"), (Reading("FPI-2", 2), "someone-else"), (Reading("FPI-4", 4), "loadtest")]);
        // accepted: FPI-1, FPI-2 and FPI-3 (never logged); FPI-4 was logged without being accepted
        var accepted = new[] { logged[0], logged[1], lost }.Select(i => new AcceptedIndication(id, i)).ToList();

        var result = LogVerification.Verify(DatabasePath, [id], accepted, "loadtest");

        Assert.False(result.Passed);
        Assert.Equal(1, result.Missing);
        Assert.Equal(1, result.Unexpected);
        Assert.Equal(1, result.Misattributed);
        Assert.Contains(result.Findings, f => f.Contains("FPI-3", StringComparison.Ordinal) && f.Contains("not in the log", StringComparison.Ordinal));
    }

    private (long Id, List<Indication> Logged) Log(IReadOnlyList<(Indication Indication, string Account)> readings)
    {
        using var store = IncidentStore.Open(DatabasePath);
        var incident = new Incident(ReportedAt, null, System.Collections.Immutable.ImmutableDictionary<SwitchId, SwitchPosition>.Empty, null, FaultType.LG, [], []);
        var id = store.OpenIncident("test grid", incident, new Actor("loadtest", "operator"));
        foreach (var (indication, account) in readings)
        {
            store.Append(id, new IndicationEntered(indication), new Actor(account, "operator"));
        }

        return (id.Value, [.. readings.Select(r => r.Indication)]);
    }

    public void Dispose() => _db.Dispose();
}
