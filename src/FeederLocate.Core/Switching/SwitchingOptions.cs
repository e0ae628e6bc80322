using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Settings of the switching planner. Defaults are common practice for MV distribution; every number
/// is shown with the plan (its approximations) so the operator sees what was assumed.
/// </summary>
public sealed record SwitchingOptions
{
    /// <summary>
    /// A fixed cold-load pickup multiplier on the load of every node that was without supply, 1 to 10; null (the
    /// default) takes it from <see cref="ColdLoadCurve"/> at the outage's duration.
    /// </summary>
    public double? ColdLoadFactor { get; init; }

    /// <summary>
    /// Cold-load pickup multiplier over the outage's duration, linear between points and flat beyond the last:
    /// about 1.5 after a short outage rising to 2 or more after hours (common practice; the points from memory).
    /// </summary>
    public ImmutableArray<ColdLoadPoint> ColdLoadCurve { get; init; } =
    [
        new(TimeSpan.Zero, 1.5), new(TimeSpan.FromMinutes(30), 1.6), new(TimeSpan.FromHours(2), 2.0), new(TimeSpan.FromHours(6), 2.5),
    ];

    /// <summary>The cold-load multiplier after an outage of <paramref name="outage"/>.</summary>
    public double ColdLoadAt(TimeSpan outage)
    {
        if (ColdLoadFactor is { } fixedFactor)
        {
            return fixedFactor;
        }

        var points = ColdLoadCurve;
        if (outage <= points[0].Outage)
        {
            return points[0].Factor;
        }

        for (var k = 1; k < points.Length; k++)
        {
            if (outage <= points[k].Outage)
            {
                var share = (outage - points[k - 1].Outage) / (points[k].Outage - points[k - 1].Outage);
                return points[k - 1].Factor + (share * (points[k].Factor - points[k - 1].Factor));
            }
        }

        return points[^1].Factor;
    }

    /// <summary>Lowest voltage allowed at any live node in the final state, pu of nominal, 0.5 to 1 (0.90 pu: common practice for MV).</summary>
    public double VoltageLimitPu { get; init; } = 0.90;

    /// <summary>Crew travel to a manual device whose grid data gives no travelMinutes (30 min: common practice, from memory).</summary>
    public TimeSpan DefaultTravelTime { get; init; } = TimeSpan.FromMinutes(30);

    /// <summary>One remote operation from the control room, command to confirmed position (1 min: common practice).</summary>
    public TimeSpan RemoteOperationTime { get; init; } = TimeSpan.FromMinutes(1);

    /// <summary>One manual operation by a crew on site (5 min: common practice, from memory).</summary>
    public TimeSpan ManualOperationTime { get; init; } = TimeSpan.FromMinutes(5);

    /// <summary>Replacing a fuse link on site (10 min: from memory).</summary>
    public TimeSpan FuseReplacementTime { get; init; } = TimeSpan.FromMinutes(10);

    /// <summary>A test order of trial closures is given when the top section holds less than this share of the probability, 0 to 1.</summary>
    public double SplitTopShare { get; init; } = 0.80;

    /// <summary>The suspects of a split ranking: the fewest top sections holding this share of the probability, 0 to 1.</summary>
    public double SplitMassShare { get; init; } = 0.95;

    /// <summary>At most this many suspects enter a test order of trial closures.</summary>
    public int MaxTrialSuspects { get; init; } = 6;

    /// <summary>At most this many groups of zones are checked by load flow per restoring switch, the largest first; beyond it the plan says so.</summary>
    public int MaxCandidatesPerSource { get; init; } = 256;

    /// <summary>At most this many branches of the exact selection of restoring switches (a deterministic limit, never a clock); beyond it the plan says so.</summary>
    public long MaxSelectionBranches { get; init; } = 1_000_000;

    /// <summary>At most this many entries in the standing earth-fault search.</summary>
    public int MaxSearchEntries { get; init; } = 24;

    /// <summary>How the standing earth-fault search picks its next device.</summary>
    public EarthFaultSearchOrder EarthFaultSearchOrder { get; init; } = EarthFaultSearchOrder.FewestCustomerInterruptions;

    public static SwitchingOptions Default { get; } = new();

    /// <summary>Throws <see cref="ArgumentOutOfRangeException"/> naming the setting and its valid range.</summary>
    public void Validate()
    {
        if (ColdLoadFactor is { } factor && !(factor is >= 1 and <= 10))
        {
            throw new ArgumentOutOfRangeException(nameof(ColdLoadFactor), ColdLoadFactor, "cold-load factor must be within 1 to 10");
        }

        if (ColdLoadCurve.IsDefaultOrEmpty || ColdLoadCurve.Any(p => !(p.Factor is >= 1 and <= 10) || p.Outage < TimeSpan.Zero)
            || ColdLoadCurve.Zip(ColdLoadCurve.Skip(1)).Any(p => p.Second.Outage <= p.First.Outage))
        {
            throw new ArgumentOutOfRangeException(nameof(ColdLoadCurve), "the cold-load curve needs at least one point, outages ≥ 0 in increasing order and factors within 1 to 10");
        }

        if (!(VoltageLimitPu is >= 0.5 and <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(VoltageLimitPu), VoltageLimitPu, "voltage limit must be within 0.5 to 1 pu");
        }

        foreach (var (name, time) in new[]
        {
            (nameof(DefaultTravelTime), DefaultTravelTime), (nameof(RemoteOperationTime), RemoteOperationTime),
            (nameof(ManualOperationTime), ManualOperationTime), (nameof(FuseReplacementTime), FuseReplacementTime),
        })
        {
            if (time < TimeSpan.Zero)
            {
                throw new ArgumentOutOfRangeException(name, time, $"{name} must not be negative");
            }
        }

        if (!(SplitTopShare is > 0 and <= 1) || !(SplitMassShare is > 0 and <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(SplitTopShare), "split shares must be within 0 to 1");
        }

        ArgumentOutOfRangeException.ThrowIfLessThan(MaxTrialSuspects, 2);
        ArgumentOutOfRangeException.ThrowIfLessThan(MaxCandidatesPerSource, 2);
        ArgumentOutOfRangeException.ThrowIfLessThan(MaxSelectionBranches, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(MaxSearchEntries, 1);
    }
}

/// <summary>The criterion of the standing earth-fault search.</summary>
public enum EarthFaultSearchOrder
{
    /// <summary>Most probability cut off per customer interrupted first: least expected customer interruptions.</summary>
    FewestCustomerInterruptions,

    /// <summary>About half of the remaining probability each time: fewest entries.</summary>
    Bisection,
}

/// <summary>One point of the cold-load curve: after an outage of <paramref name="Outage"/>, the load is <paramref name="Factor"/> times normal at pickup.</summary>
public readonly record struct ColdLoadPoint(TimeSpan Outage, double Factor);
