using FeederLocate.Core.Evidence;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.LoadTest;

/// <summary>
/// "Nothing lost": reads the incident log after the app has stopped and checks that every accepted
/// indication is there once, as posted and logged by the expected account, and that the log holds no
/// indication that was not accepted.
/// </summary>
public static class LogVerification
{
    private const int FindingsShown = 10;

    public static VerificationResult Verify(string databasePath, IReadOnlyCollection<long> incidents, IReadOnlyCollection<AcceptedIndication> accepted, string expectedAccount)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(databasePath);
        ArgumentNullException.ThrowIfNull(incidents);
        ArgumentNullException.ThrowIfNull(accepted);
        ArgumentException.ThrowIfNullOrWhiteSpace(expectedAccount);

        // Reading times are unique across the run, so (incident, readAt) names one posted indication.
        var expected = new Dictionary<(long Incident, DateTimeOffset ReadAt), Indication>();
        var findings = new List<string>();
        foreach (var a in accepted)
        {
            if (a.Indication.ReadAt is not { } readAt || !expected.TryAdd((a.IncidentId, readAt), a.Indication))
            {
                findings.Add($"incident {a.IncidentId}: accepted indication of {a.Indication.Indicator.Value} has no unique readAt");
            }
        }

        using var store = IncidentStore.Open(databasePath);
        var found = new HashSet<(long, DateTimeOffset)>();
        int logged = 0, unexpected = 0, misattributed = 0;
        var actorsSeen = new SortedSet<string>(StringComparer.Ordinal);
        foreach (var incident in incidents.Distinct())
        {
            foreach (var stored in store.Events(new IncidentId(incident)))
            {
                if (stored.Event is not IndicationEntered { Indication: var indication })
                {
                    continue;
                }

                logged++;
                actorsSeen.Add(stored.Actor.ToString());
                if (stored.Actor.Name != expectedAccount)
                {
                    misattributed++;
                    Note(findings, $"event {stored.Id}: logged by {stored.Actor}, not by {expectedAccount}");
                }

                var key = (incident, indication.ReadAt ?? DateTimeOffset.MinValue);
                if (!expected.TryGetValue(key, out var posted) || !SameReading(posted, indication) || !found.Add(key))
                {
                    unexpected++;
                    Note(findings, $"event {stored.Id}: {indication.Indicator.Value} {indication.State} read at {indication.ReadAt:O} was not accepted, or is logged twice or changed");
                }
            }
        }

        var missing = expected.Keys.Count(k => !found.Contains(k));
        foreach (var key in expected.Keys.Where(k => !found.Contains(k)).Take(FindingsShown))
        {
            Note(findings, $"incident {key.Incident}: accepted {expected[key].Indicator.Value} read at {key.ReadAt:O} is not in the log");
        }

        return new VerificationResult(accepted.Count, logged, missing, unexpected, misattributed, expectedAccount, [.. actorsSeen], [.. findings.Take(FindingsShown)]);
    }

    private static bool SameReading(Indication posted, Indication logged) =>
        posted.Indicator == logged.Indicator && posted.State == logged.State && posted.Source == logged.Source
        && posted.ReadAt == logged.ReadAt && posted.Distrusted == logged.Distrusted;

    private static void Note(List<string> findings, string finding)
    {
        if (findings.Count < FindingsShown)
        {
            findings.Add(finding);
        }
    }
}

/// <summary>What the log check found: counts of indications accepted, logged, missing, not accepted (or twice, or changed) and logged by another account.</summary>
public sealed record VerificationResult(
    int Accepted,
    int Logged,
    int Missing,
    int Unexpected,
    int Misattributed,
    string ExpectedAccount,
    IReadOnlyList<string> LoggedBy,
    IReadOnlyList<string> Findings)
{
    /// <summary>Every accepted indication is in the log, once, by the expected account, and nothing else is.</summary>
    public bool Passed => Missing == 0 && Unexpected == 0 && Misattributed == 0 && Logged == Accepted && Findings.Count == 0;
}
