using System.Globalization;

namespace FeederLocate.Application.Words;

/// <summary>Numbers as people read them on the page and in the command line's text; the file formats keep full precision.</summary>
public static class PeopleNumbers
{
    private static readonly CultureInfo Numbers = CultureInfo.InvariantCulture;

    /// <summary>A whole count with thousands grouped: 12,345.</summary>
    public static string Count(double value) => Math.Round(value).ToString("#,0", Numbers);

    /// <summary>A fault resistance: "0.5 Ω", "12 Ω", "350 Ω", "1.2 kΩ".</summary>
    public static string Resistance(double ohm) => Math.Abs(ohm) switch
    {
        >= 10_000 => $"{(ohm / 1000).ToString("0", Numbers)} kΩ",
        >= 1000 => $"{(ohm / 1000).ToString("0.#", Numbers)} kΩ",
        >= 10 => $"{ohm.ToString("0", Numbers)} Ω",
        >= 1 => $"{ohm.ToString("0.#", Numbers)} Ω",
        _ => $"{ohm.ToString("0.##", Numbers)} Ω",
    };
}
