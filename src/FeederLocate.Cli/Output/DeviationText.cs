using System.Globalization;

namespace FeederLocate.Cli.Output;

/// <summary>How a deviation in σ is printed: its sign and one decimal; one that rounds to zero is 0.0.</summary>
public static class DeviationText
{
    public static string Sigma(double deviation)
    {
        var rounded = Math.Round(deviation, 1, MidpointRounding.AwayFromZero);
        return rounded == 0 ? "0.0" : rounded.ToString("+0.0;-0.0", CultureInfo.InvariantCulture);
    }
}
