using System.Globalization;

namespace FeederLocate.Application.Naming;

/// <summary>Numbers for people, the same on the page and in the command line's text.</summary>
public static class Figures
{
    /// <summary>
    /// A figure to three significant digits, thousands grouped, never in exponent form:
    /// 12,300; 1,230; 123; 12.3; 1.23; 0.0123; "–" for a value that is not finite.
    /// </summary>
    public static string Significant(double value)
    {
        if (!double.IsFinite(value))
        {
            return "–";
        }

        if (value == 0)
        {
            return "0";
        }

        var digits = (int)Math.Floor(Math.Log10(Math.Abs(value))) + 1;
        if (digits >= 3)
        {
            var unit = Math.Pow(10, digits - 3);
            return (Math.Round(value / unit) * unit).ToString("#,0", CultureInfo.InvariantCulture);
        }

        var decimals = 3 - digits;
        return Math.Round(value, decimals).ToString("0." + new string('#', decimals), CultureInfo.InvariantCulture);
    }
}
