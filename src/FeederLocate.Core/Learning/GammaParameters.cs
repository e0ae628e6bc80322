using MathNet.Numerics.Distributions;

namespace FeederLocate.Core.Learning;

/// <summary>
/// A Gamma(α, β) belief about a rate λ ≥ 0, with shape α and rate (inverse scale) β:
/// density ∝ λ^(α−1)·e^(−β·λ), mean α/β, variance α/β². For a fault rate in faults per km·year,
/// α counts faults and β is an exposure in km·years.
/// Conjugate to the Poisson count: after k events over exposure X the belief is Gamma(α + k, β + X).
/// </summary>
/// <remarks>α = 0 is allowed and means certainty that λ = 0 (a line type stated at 0 faults per
/// 100 km·year); its mean and every quantile are 0 until an event arrives.</remarks>
public sealed record GammaParameters
{
    public GammaParameters(double shape, double rate)
    {
        if (!double.IsFinite(shape) || shape < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(shape), shape, "shape α must be finite and ≥ 0");
        }

        if (!double.IsFinite(rate) || rate <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(rate), rate, "rate β must be finite and > 0");
        }

        Shape = shape;
        Rate = rate;
    }

    /// <summary>Shape α (events).</summary>
    public double Shape { get; }

    /// <summary>Rate β (exposure, for instance km·years).</summary>
    public double Rate { get; }

    /// <summary>Mean α/β.</summary>
    public double Mean => Shape / Rate;

    /// <summary>The conjugate update: Gamma(α + <paramref name="events"/>, β + <paramref name="exposure"/>).</summary>
    public GammaParameters Update(int events, double exposure)
    {
        if (events < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(events), events, "must be >= 0");
        }
        if (!double.IsFinite(exposure) || exposure < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(exposure), exposure, "exposure must be finite and ≥ 0");
        }

        return new GammaParameters(Shape + events, Rate + exposure);
    }

    /// <summary>The value below which the rate lies with probability <paramref name="probability"/> (0..1).</summary>
    public double Quantile(double probability)
    {
        CredibleInterval.CheckProbability(probability);
        return Shape == 0 ? 0 : Gamma.InvCDF(Shape, Rate, probability);
    }

    /// <summary>Equal-tailed interval holding the rate with probability <paramref name="level"/> (0..1, exclusive).</summary>
    public CredibleInterval Interval(double level) =>
        CredibleInterval.EqualTailed(level, Quantile);

    public override string ToString() => $"Gamma({Shape:G6}, {Rate:G6})";
}
