using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// The learned fault rate of one segment, shrunk toward its line type.
/// Prior Gamma(m·S, S), where m is the line type's posterior mean (faults per km·year) and S the shrink
/// strength in km·years; posterior Gamma(m·S + k, S + L·T) after k faults on the segment of length L
/// over T years.
/// </summary>
/// <param name="Faults">k: confirmed faults on this segment.</param>
/// <param name="ExposureKmYears">L·T: length × observation years.</param>
public sealed record FaultRatePosterior(
    SegmentId Segment,
    LineTypeId LineType,
    double LengthKm,
    GammaParameters Prior,
    GammaParameters Posterior,
    int Faults,
    double ExposureKmYears)
{
    /// <summary>Posterior mean in faults per km·year.</summary>
    public double FaultsPerKmYear => Posterior.Mean;

    /// <summary>Posterior mean in faults per 100 km·year, the unit of the grid file.</summary>
    public double FaultsPer100KmYear => 100 * Posterior.Mean;

    /// <summary>Expected faults per year on the whole segment: mean rate × length. The ranking's prior weight.</summary>
    public double ExpectedFaultsPerYear => Posterior.Mean * LengthKm;

    /// <summary>90 % equal-tailed credible interval in faults per km·year.</summary>
    public CredibleInterval Interval90PerKmYear => Posterior.Interval(CredibleInterval.DefaultLevel);
}
