using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// The learned fault rate of a line type, pooled over all its segments.
/// Prior Gamma(α0, β0) with α0 = (r/100)·E0, β0 = E0 (r: the type's faults per 100 km·year, E0 the prior
/// exposure); posterior Gamma(α0 + k, β0 + X) after k faults over exposure X = total length × years.
/// </summary>
/// <param name="TotalLengthKm">Length of all the grid's segments of this type.</param>
/// <param name="Faults">k: confirmed faults on segments of this type.</param>
/// <param name="ExposureKmYears">X: total length × observation years.</param>
/// <param name="Choice">The prior its segments shrink toward (type-level rate and strength): chosen by data, or as configured. Set by <see cref="FaultRateLearning"/>.</param>
public sealed record LineTypeFaultRate(
    LineTypeId LineType,
    double TotalLengthKm,
    GammaParameters Prior,
    GammaParameters Posterior,
    int Faults,
    double ExposureKmYears,
    PriorChoice.FaultRatePriorChoice? Choice = null)
{
    /// <summary>Posterior mean in faults per km·year.</summary>
    public double FaultsPerKmYear => Posterior.Mean;

    /// <summary>Posterior mean in faults per 100 km·year, the unit of the grid file.</summary>
    public double FaultsPer100KmYear => 100 * Posterior.Mean;

    /// <summary>90 % equal-tailed credible interval in faults per km·year.</summary>
    public CredibleInterval Interval90PerKmYear => Posterior.Interval(CredibleInterval.DefaultLevel);
}
