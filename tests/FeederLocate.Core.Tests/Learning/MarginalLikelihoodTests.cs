using FeederLocate.Core.Learning.PriorChoice;

namespace FeederLocate.Core.Tests.Learning;

/// <summary>The negative binomial and beta-binomial marginals against values worked out by hand.</summary>
public class MarginalLikelihoodTests
{
    [Fact]
    public void Gamma_Poisson_with_shape_one_is_the_geometric_law()
    {
        // λ ~ Gamma(1, 2), exposure 4: P(k) = (2/6)·(4/6)^k; k = 2 gives (1/3)·(4/9) = 4/27.
        Assert.Equal(Math.Log(4.0 / 27), MarginalLikelihood.GammaPoisson(2, 4, 1, 2), 12);
        // k = 0: P = β/(β + E) raised to α = 1: 1/3.
        Assert.Equal(Math.Log(1.0 / 3), MarginalLikelihood.GammaPoisson(0, 4, 1, 2), 12);
    }

    [Fact]
    public void Gamma_Poisson_probabilities_sum_to_one()
    {
        // Gamma(0.7, 3) over 25 km·years: mean count 0.7/3·25 = 5.8; the tail beyond 400 is negligible.
        var total = Enumerable.Range(0, 400).Sum(k => Math.Exp(MarginalLikelihood.GammaPoisson(k, 25, 0.7, 3)));
        Assert.Equal(1, total, 9);
    }

    [Fact]
    public void Without_exposure_only_no_event_is_possible()
    {
        Assert.Equal(0, MarginalLikelihood.GammaPoisson(0, 0, 2, 5));
        Assert.Equal(double.NegativeInfinity, MarginalLikelihood.GammaPoisson(1, 0, 2, 5));
    }

    [Fact]
    public void Beta_binomial_with_a_uniform_prior_gives_every_count_the_same_probability()
    {
        // p ~ Beta(1, 1): P(x | n) = 1/(n + 1) for every x.
        Assert.Equal(Math.Log(1.0 / 3), MarginalLikelihood.BetaBinomial(1, 2, 1, 1), 12);
        Assert.Equal(Math.Log(1.0 / 11), MarginalLikelihood.BetaBinomial(7, 10, 1, 1), 12);
    }

    [Fact]
    public void Beta_binomial_of_one_trial_is_the_prior_mean()
    {
        // Beta(2, 6): P(success in 1 trial) = 2/8.
        Assert.Equal(Math.Log(0.25), MarginalLikelihood.BetaBinomial(1, 1, 2, 6), 12);
    }

    [Fact]
    public void Fractional_counts_lie_between_their_whole_neighbours()
    {
        var low = MarginalLikelihood.BetaBinomial(1, 5, 1, 4);
        var high = MarginalLikelihood.BetaBinomial(2, 5, 1, 4);
        var between = MarginalLikelihood.BetaBinomial(1.5, 5, 1, 4);
        Assert.InRange(between, Math.Min(low, high) - 0.5, Math.Max(low, high) + 0.5);
        Assert.True(double.IsFinite(MarginalLikelihood.GammaPoisson(2.5, 10, 1, 20)));
    }

    [Fact]
    public void Bad_counts_are_refused()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => MarginalLikelihood.BetaBinomial(3, 2, 1, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => MarginalLikelihood.GammaPoisson(-1, 2, 1, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => MarginalLikelihood.GammaPoisson(1, 2, 0, 1));
    }
}
