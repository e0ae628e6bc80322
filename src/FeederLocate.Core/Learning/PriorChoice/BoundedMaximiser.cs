using MathNet.Numerics;
using MathNet.Numerics.Optimization;

namespace FeederLocate.Core.Learning.PriorChoice;

/// <summary>The maximum of a function of one variable within stated bounds, and whether it lies on a bound.</summary>
public readonly record struct BoundedMaximum(double Argument, double Value, bool AtBound);

/// <summary>
/// Maximises a function of one positive variable within [lower, upper] on a logarithmic scale: a scan
/// of <see cref="ScanPoints"/> points finds the best bracket (so a maximum on a bound is found as such,
/// and a second, lower hump is not mistaken for it), then MathNet's golden-section search refines it.
/// </summary>
public static class BoundedMaximiser
{
    /// <summary>Points of the logarithmic scan.</summary>
    public const int ScanPoints = 25;

    /// <summary>Relative precision of the argument after refining.</summary>
    public const double RelativeTolerance = 1e-6;

    public static BoundedMaximum Maximise(Func<double, double> function, double lower, double upper)
    {
        ArgumentNullException.ThrowIfNull(function);
        if (!(lower > 0) || !(upper >= lower) || !double.IsFinite(upper))
        {
            throw new ArgumentOutOfRangeException(nameof(lower), $"bounds must satisfy 0 < lower ≤ upper < ∞, got {lower} and {upper}");
        }

        if (upper == lower)
        {
            return new BoundedMaximum(lower, function(lower), true);
        }

        var (logLower, logUpper) = (Math.Log(lower), Math.Log(upper));
        var step = (logUpper - logLower) / (ScanPoints - 1);
        var best = 0;
        var values = new double[ScanPoints];
        for (var k = 0; k < ScanPoints; k++)
        {
            values[k] = function(Math.Exp(logLower + (k * step)));
            if (values[k] > values[best])
            {
                best = k;
            }
        }

        if (best == 0 || best == ScanPoints - 1)
        {
            return new BoundedMaximum(best == 0 ? lower : upper, values[best], true);
        }

        double Negated(double logX) => -function(Math.Exp(logX));
        try
        {
            var found = FindMinimum.OfScalarFunctionConstrained(
                Negated, logLower + ((best - 1) * step), logLower + ((best + 1) * step), RelativeTolerance);
            var value = -Negated(found);
            return value >= values[best] ? new BoundedMaximum(Math.Exp(found), value, false) : new BoundedMaximum(Math.Exp(logLower + (best * step)), values[best], false);
        }
        catch (OptimizationException)
        {
            return new BoundedMaximum(Math.Exp(logLower + (best * step)), values[best], false);
        }
    }
}
