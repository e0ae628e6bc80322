namespace FeederLocate.Core.Switching;

/// <summary>
/// Settings of the switching planner. Defaults are common practice for MV distribution; every number
/// is shown with the plan (its approximations) so the operator sees what was assumed.
/// </summary>
public sealed record SwitchingOptions
{
    /// <summary>Cold-load pickup multiplier on the load of every node that was without supply, ≥ 1 (about 2 for the first minutes: common practice).</summary>
    public double ColdLoadFactor { get; init; } = 2.0;

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
        if (!(ColdLoadFactor is >= 1 and <= 10))
        {
            throw new ArgumentOutOfRangeException(nameof(ColdLoadFactor), ColdLoadFactor, "cold-load factor must be within 1 to 10");
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
