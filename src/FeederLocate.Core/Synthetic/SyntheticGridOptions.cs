using FeederLocate.Core.Model;

namespace FeederLocate.Core.Synthetic;

/// <summary>
/// Size and shape of a generated radial grid (for benchmarks and property tests; the numbers are
/// invented, the line data are the sample catalogue's).
/// </summary>
/// <param name="Segments">Number of line segments, ≥ 1.</param>
/// <param name="Seed">Seed of the pseudo-random generator: the same options give the same grid.</param>
/// <param name="IndicatorsPerSegment">Share of segments with an indicator at their supplied end, 0 to 1.</param>
/// <param name="SegmentsPerFeeder">About how many segments a feeder has.</param>
/// <param name="SegmentsPerSwitch">About how many segments lie between two sectionalising switches.</param>
/// <param name="Substations">Number of substations, ≥ 1.</param>
public sealed record SyntheticGridOptions(
    int Segments,
    int Seed,
    GroundingScheme Scheme = GroundingScheme.Resonant,
    double IndicatorsPerSegment = 0.1,
    int SegmentsPerFeeder = 60,
    int SegmentsPerSwitch = 4,
    int Substations = 2)
{
    /// <summary>Default share of sectionalising devices that are disconnectors, and of those that are fuses (one in six each).</summary>
    public const double DefaultKindShare = 1.0 / 6;

    /// <summary>Share of new segments that branch off anywhere on the feeder (laterals) instead of extending its newest part, 0 to 1.</summary>
    public double LateralShare { get; init; } = 0.3;

    /// <summary>Normally-open ties per feeder besides the one joining the ends of neighbouring feeders, each from a node of the feeder to a node of another feeder, ≥ 0.</summary>
    public int ExtraTiesPerFeeder { get; init; }

    /// <summary>The extra ties join only feeders of different substations (needs at least two).</summary>
    public bool ExtraTiesBetweenSubstations { get; init; }

    /// <summary>Share of sectionalising devices that are disconnectors, 0 to 1.</summary>
    public double DisconnectorShare { get; init; } = DefaultKindShare;

    /// <summary>Share of sectionalising devices that are fuses, 0 to 1 (with <see cref="DisconnectorShare"/> at most 1).</summary>
    public double FuseShare { get; init; } = DefaultKindShare;

    /// <summary>Multiplier on every node's load, &gt; 0 (customers stay as drawn).</summary>
    public double LoadScale { get; init; } = 1.0;

    /// <summary>
    /// Crew bases, ≥ 0: none gives a grid without <c>crews</c> (drawn apart from the rest, so the network is the
    /// same either way). Each base sits at the bus of a substation in turn with <see cref="CrewsPerBase"/> crews and
    /// its own travel time to about half the manual devices.
    /// </summary>
    public int CrewBases { get; init; }

    /// <summary>Crews at each base, 1 to 1000.</summary>
    public int CrewsPerBase { get; init; } = 2;

    public void Validate()
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(Segments, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(SegmentsPerFeeder, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(SegmentsPerSwitch, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(Substations, 1);
        ArgumentOutOfRangeException.ThrowIfNegative(ExtraTiesPerFeeder);
        ArgumentOutOfRangeException.ThrowIfNegative(CrewBases);
        ArgumentOutOfRangeException.ThrowIfLessThan(CrewsPerBase, 1);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(CrewsPerBase, 1000);
        if (!(IndicatorsPerSegment is >= 0 and <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(IndicatorsPerSegment), IndicatorsPerSegment, "share of segments with an indicator: 0 to 1");
        }

        if (!(LateralShare is >= 0 and <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(LateralShare), LateralShare, "share of segments that branch off: 0 to 1");
        }

        if (!(DisconnectorShare is >= 0 and <= 1) || !(FuseShare is >= 0 and <= 1) || DisconnectorShare + FuseShare > 1)
        {
            throw new ArgumentOutOfRangeException(nameof(DisconnectorShare), $"shares of disconnectors ({DisconnectorShare}) and fuses ({FuseShare}): each 0 to 1, together at most 1");
        }

        if (!(LoadScale is > 0 and <= 100))
        {
            throw new ArgumentOutOfRangeException(nameof(LoadScale), LoadScale, "load scale: above 0, at most 100");
        }

        if (ExtraTiesBetweenSubstations && Substations < 2)
        {
            throw new ArgumentOutOfRangeException(nameof(ExtraTiesBetweenSubstations), "ties between substations need at least two substations");
        }
    }
}
