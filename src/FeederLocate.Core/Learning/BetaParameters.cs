using MathNet.Numerics.Distributions;

namespace FeederLocate.Core.Learning;

/// <summary>
/// A Beta(a, b) belief about a probability p: density ∝ p^(a−1)·(1−p)^(b−1), mean a/(a + b).
/// Conjugate to counted trials: after x successes in n trials the belief is Beta(a + x, b + n − x),
/// so a and b read as pseudo-counts of successes and failures.
/// </summary>
public sealed record BetaParameters
{
    public BetaParameters(double a, double b)
    {
        if (!double.IsFinite(a) || a <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(a), a, "a must be finite and > 0");
        }

        if (!double.IsFinite(b) || b <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(b), b, "b must be finite and > 0");
        }

        A = a;
        B = b;
    }

    /// <summary>Pseudo-count of successes.</summary>
    public double A { get; }

    /// <summary>Pseudo-count of failures.</summary>
    public double B { get; }

    /// <summary>Mean a/(a + b).</summary>
    public double Mean => A / (A + B);

    /// <summary>Total pseudo-count a + b: how many trials the belief weighs like.</summary>
    public double Strength => A + B;

    /// <summary>
    /// A belief with mean <paramref name="mean"/> (0..1, exclusive) weighing like <paramref name="strength"/> trials:
    /// Beta(mean·strength, (1 − mean)·strength).
    /// </summary>
    public static BetaParameters FromMean(double mean, double strength)
    {
        if (!(mean > 0 && mean < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(mean), mean, "mean must lie strictly between 0 and 1");
        }

        if (!double.IsFinite(strength) || strength <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(strength), strength, "strength must be finite and > 0");
        }

        return new BetaParameters(mean * strength, (1 - mean) * strength);
    }

    /// <summary>The conjugate update: Beta(a + <paramref name="successes"/>, b + <paramref name="trials"/> − successes).</summary>
    public BetaParameters Update(int successes, int trials)
    {
        if (successes < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(successes), successes, "must be >= 0");
        }
        ArgumentOutOfRangeException.ThrowIfLessThan(trials, successes);
        return new BetaParameters(A + successes, B + (trials - successes));
    }

    /// <summary>The conjugate update with weighted (fractional) counts: Beta(a + x, b + n − x), 0 ≤ x ≤ n.</summary>
    public BetaParameters Update(double successes, double trials)
    {
        if (!double.IsFinite(successes) || successes < 0 || !double.IsFinite(trials) || trials < successes)
        {
            throw new ArgumentOutOfRangeException(nameof(successes), successes, $"need 0 ≤ successes ≤ trials, got {successes} of {trials}");
        }

        return new BetaParameters(A + successes, B + (trials - successes));
    }

    /// <summary>The value below which p lies with probability <paramref name="probability"/> (0..1).</summary>
    public double Quantile(double probability)
    {
        CredibleInterval.CheckProbability(probability);
        return Beta.InvCDF(A, B, probability);
    }

    /// <summary>Equal-tailed interval holding p with probability <paramref name="level"/> (0..1, exclusive).</summary>
    public CredibleInterval Interval(double level) =>
        CredibleInterval.EqualTailed(level, Quantile);

    public override string ToString() => $"Beta({A:G6}, {B:G6})";
}
