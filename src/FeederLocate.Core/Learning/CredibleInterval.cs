namespace FeederLocate.Core.Learning;

/// <summary>
/// An equal-tailed credible interval: the quantity lies below <see cref="Lower"/> with probability
/// (1 − level)/2 and above <see cref="Upper"/> with the same probability. Same unit as the quantity.
/// </summary>
public sealed record CredibleInterval(double Lower, double Upper, double Level)
{
    /// <summary>The level used wherever the project reports an interval: 90 %.</summary>
    public const double DefaultLevel = 0.9;

    internal static CredibleInterval EqualTailed(double level, Func<double, double> quantile)
    {
        if (!(level > 0 && level < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(level), level, "level must lie strictly between 0 and 1");
        }

        var tail = (1 - level) / 2;
        return new CredibleInterval(quantile(tail), quantile(1 - tail), level);
    }

    internal static void CheckProbability(double probability)
    {
        if (!(probability >= 0 && probability <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(probability), probability, "probability must lie in 0..1");
        }
    }
}
