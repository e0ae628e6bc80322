using FeederLocate.Core.Learning;

namespace FeederLocate.Core.Tests.Learning;

/// <summary>
/// Credible intervals checked against closed forms where the distribution has one, and against MathNet's
/// cumulative distribution (a general-purpose reference library) where it has none.
/// </summary>
public class DistributionParameterTests
{
    private const double Tolerance = 1e-9;

    [Fact]
    public void Gamma_update_adds_the_events_to_the_shape_and_the_exposure_to_the_rate()
    {
        // Gamma(1.5, 50) + 2 faults over 10 km·years → Gamma(3.5, 60), mean 3.5/60 = 0.058333 per km·year.
        var posterior = new GammaParameters(1.5, 50).Update(2, 10);

        Assert.Equal(new GammaParameters(3.5, 60), posterior);
        Assert.Equal(3.5 / 60, posterior.Mean, Tolerance);
    }

    [Fact]
    public void Beta_update_adds_successes_to_a_and_failures_to_b()
    {
        // Beta(1, 19) + 3 misses in 10 trials → Beta(1 + 3, 19 + 7) = Beta(4, 26), mean 4/30 = 0.1333.
        var posterior = new BetaParameters(1, 19).Update(3, 10);

        Assert.Equal(new BetaParameters(4, 26), posterior);
        Assert.Equal(4.0 / 30, posterior.Mean, Tolerance);
    }

    [Fact]
    public void Gamma_interval_with_shape_1_is_the_exponential_quantiles()
    {
        // Gamma(1, β) is exponential: F(x) = 1 − e^(−βx), so the p-quantile is −ln(1 − p)/β.
        // β = 10: lower = −ln(0.95)/10 = 0.0051293294, upper = −ln(0.05)/10 = 0.2995732274.
        var interval = new GammaParameters(1, 10).Interval(0.9);

        Assert.Equal(0.0051293294388, interval.Lower, Tolerance);
        Assert.Equal(0.2995732273554, interval.Upper, Tolerance);
        Assert.Equal(0.9, interval.Level);
    }

    [Fact]
    public void Gamma_interval_with_integer_shape_leaves_5_percent_in_each_tail()
    {
        // Gamma(3, β): F(x) = 1 − e^(−βx)·(1 + βx + (βx)²/2) (Erlang distribution).
        const double rate = 60;
        var interval = new GammaParameters(3, rate).Interval(0.9);

        Assert.Equal(0.05, ErlangCdf3(rate * interval.Lower), Tolerance);
        Assert.Equal(0.95, ErlangCdf3(rate * interval.Upper), Tolerance);
    }

    [Fact]
    public void Gamma_interval_with_fractional_shape_agrees_with_MathNet()
    {
        var reference = new MathNet.Numerics.Distributions.Gamma(shape: 3.5, rate: 60);

        var interval = new GammaParameters(3.5, 60).Interval(0.9);

        Assert.Equal(0.05, reference.CumulativeDistribution(interval.Lower), 1e-7);
        Assert.Equal(0.95, reference.CumulativeDistribution(interval.Upper), 1e-7);
    }

    [Fact]
    public void Beta_interval_with_a_equal_1_is_the_closed_form_quantiles()
    {
        // Beta(1, b): F(x) = 1 − (1 − x)^b, so the p-quantile is 1 − (1 − p)^(1/b).
        // b = 19: lower = 1 − 0.95^(1/19) = 0.0026960063, upper = 1 − 0.05^(1/19) = 0.1458685033.
        var interval = new BetaParameters(1, 19).Interval(0.9);

        Assert.Equal(0.0026960063029, interval.Lower, Tolerance);
        Assert.Equal(0.1458685033122, interval.Upper, Tolerance);
    }

    [Fact]
    public void Beta_interval_with_integer_parameters_leaves_5_percent_in_each_tail()
    {
        // For integer a, b: F(x) = P(Binomial(a + b − 1, x) ≥ a).
        var interval = new BetaParameters(4, 26).Interval(0.9);

        Assert.Equal(0.05, BetaCdfByBinomial(4, 26, interval.Lower), 1e-7);
        Assert.Equal(0.95, BetaCdfByBinomial(4, 26, interval.Upper), 1e-7);
    }

    [Fact]
    public void Gamma_with_zero_shape_is_certain_of_a_zero_rate()
    {
        var none = new GammaParameters(0, 50);

        Assert.Equal(0, none.Mean);
        Assert.Equal(new CredibleInterval(0, 0, 0.9), none.Interval(0.9));
        // One fault makes it an ordinary Gamma(1, 60).
        Assert.Equal(1.0 / 60, none.Update(1, 10).Mean, Tolerance);
    }

    [Theory]
    [InlineData(-1, 1)]
    [InlineData(1, 0)]
    [InlineData(double.NaN, 1)]
    public void Gamma_parameters_out_of_range_are_refused(double shape, double rate) =>
        Assert.Throws<ArgumentOutOfRangeException>(() => new GammaParameters(shape, rate));

    [Theory]
    [InlineData(0, 1)]
    [InlineData(1, -2)]
    [InlineData(1, double.PositiveInfinity)]
    public void Beta_parameters_out_of_range_are_refused(double a, double b) =>
        Assert.Throws<ArgumentOutOfRangeException>(() => new BetaParameters(a, b));

    private static double ErlangCdf3(double x) => 1 - (Math.Exp(-x) * (1 + x + (x * x / 2)));

    private static double BetaCdfByBinomial(int a, int b, double x)
    {
        var n = a + b - 1;
        var sum = 0.0;
        for (var j = a; j <= n; j++)
        {
            sum += Choose(n, j) * Math.Pow(x, j) * Math.Pow(1 - x, n - j);
        }

        return sum;
    }

    private static double Choose(int n, int k)
    {
        var c = 1.0;
        for (var i = 1; i <= k; i++)
        {
            c = c * (n - k + i) / i;
        }

        return c;
    }
}
