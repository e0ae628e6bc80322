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

    /// <summary>A whole count with thousands grouped: 12,345.</summary>
    public static string Count(double value) => Math.Round(value).ToString("#,0", CultureInfo.InvariantCulture);

    /// <summary>A fault resistance: "0.5 Ω", "12 Ω", "350 Ω", "1.2 kΩ".</summary>
    public static string Resistance(double ohm) => Math.Abs(ohm) switch
    {
        >= 10_000 => $"{(ohm / 1000).ToString("0", CultureInfo.InvariantCulture)} kΩ",
        >= 1000 => $"{(ohm / 1000).ToString("0.#", CultureInfo.InvariantCulture)} kΩ",
        >= 10 => $"{ohm.ToString("0", CultureInfo.InvariantCulture)} Ω",
        >= 1 => $"{ohm.ToString("0.#", CultureInfo.InvariantCulture)} Ω",
        _ => $"{ohm.ToString("0.##", CultureInfo.InvariantCulture)} Ω",
    };
}
