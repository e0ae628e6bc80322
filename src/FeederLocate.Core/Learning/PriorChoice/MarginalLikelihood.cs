using MathNet.Numerics;

namespace FeederLocate.Core.Learning.PriorChoice;

/// <summary>
/// Log marginal likelihoods of counted data with the rate integrated out against a conjugate prior:
/// what empirical Bayes maximises to choose a prior's mean and strength.
/// </summary>
public static class MarginalLikelihood
{
    /// <summary>
    /// log P(k events over exposure E | λ ~ Gamma(α, β)): the negative binomial
    /// lnΓ(α + k) − lnΓ(α) − lnΓ(k + 1) + α·ln(β/(β + E)) + k·ln(E/(β + E)).
    /// Counts may be fractional (weighted); the formula holds with Γ in place of the factorial.
    /// </summary>
    public static double GammaPoisson(double events, double exposure, double shape, double rate)
    {
        Check(events, exposure);
        if (!(shape > 0) || !(rate > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(shape), "shape and rate must be > 0");
        }

        if (exposure == 0)
        {
            return events == 0 ? 0 : double.NegativeInfinity;
        }

        return SpecialFunctions.GammaLn(shape + events) - SpecialFunctions.GammaLn(shape) - SpecialFunctions.GammaLn(events + 1)
            + (shape * Math.Log(rate / (rate + exposure)))
            + (events == 0 ? 0 : events * Math.Log(exposure / (rate + exposure)));
    }

    /// <summary>
    /// log P(x successes in n trials | p ~ Beta(a, b)): the beta-binomial
    /// ln C(n, x) + ln B(a + x, b + n − x) − ln B(a, b). Counts may be fractional (weighted).
    /// </summary>
    public static double BetaBinomial(double successes, double trials, double a, double b)
    {
        Check(successes, trials);
        if (successes > trials)
        {
            throw new ArgumentOutOfRangeException(nameof(successes), successes, "successes must not exceed trials");
        }

        if (!(a > 0) || !(b > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(a), "a and b must be > 0");
        }

        var logChoose = SpecialFunctions.GammaLn(trials + 1) - SpecialFunctions.GammaLn(successes + 1) - SpecialFunctions.GammaLn(trials - successes + 1);
        return logChoose + SpecialFunctions.BetaLn(a + successes, b + trials - successes) - SpecialFunctions.BetaLn(a, b);
    }

    private static void Check(double count, double exposure)
    {
        if (!double.IsFinite(count) || count < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(count), count, "a count must be finite and ≥ 0");
        }

        if (!double.IsFinite(exposure) || exposure < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(exposure), exposure, "exposure or trials must be finite and ≥ 0");
        }
    }
}
