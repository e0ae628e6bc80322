using System.Globalization;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>The words plans use for devices and numbers.</summary>
internal static class Words
{
    public static string Kind(SwitchKind kind) => kind switch
    {
        SwitchKind.Breaker => "breaker",
        SwitchKind.Recloser => "recloser",
        SwitchKind.LoadBreakSwitch => "load-break switch",
        SwitchKind.Disconnector => "disconnector",
        SwitchKind.Fuse => "fuse",
        _ => kind.ToString(),
    };

    public static string Pu(double value) => value.ToString("0.000", CultureInfo.InvariantCulture) + " pu";

    public static string Percent(double value) => value.ToString("0", CultureInfo.InvariantCulture) + " %";

    public static string Probability(double p) => (p * 100).ToString("0.#", CultureInfo.InvariantCulture) + " %";

    public static string Number(double value) => value.ToString("0.##", CultureInfo.InvariantCulture);

    public static string List<T>(IEnumerable<T> items) => string.Join(", ", items);
}
