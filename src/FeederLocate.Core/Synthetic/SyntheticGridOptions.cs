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
    public void Validate()
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(Segments, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(SegmentsPerFeeder, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(SegmentsPerSwitch, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(Substations, 1);
        if (!(IndicatorsPerSegment is >= 0 and <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(IndicatorsPerSegment), IndicatorsPerSegment, "share of segments with an indicator: 0 to 1");
        }
    }
}
