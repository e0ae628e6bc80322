using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Web.Components.OneLine;

/// <summary>The letters and words the diagram and its legend use, so state is never shown by colour alone.</summary>
public static class DiagramSymbols
{
    public static string Letter(SwitchKind kind) => kind switch
    {
        SwitchKind.Breaker => "B",
        SwitchKind.Recloser => "R",
        SwitchKind.LoadBreakSwitch => "L",
        SwitchKind.Disconnector => "D",
        _ => "F",
    };

    public static string Name(SwitchKind kind) => kind switch
    {
        SwitchKind.Breaker => "breaker",
        SwitchKind.Recloser => "recloser",
        SwitchKind.LoadBreakSwitch => "load-break switch",
        SwitchKind.Disconnector => "disconnector",
        _ => "fuse",
    };

    /// <summary>The mark inside an indicator's circle.</summary>
    public static string Mark(IndicatorState state) => state switch
    {
        IndicatorState.Fault => "!",
        IndicatorState.None => "–",
        IndicatorState.Forward => "▶",
        IndicatorState.Reverse => "◀",
        _ => "?",
    };

    public static string Word(IndicatorState state) => state switch
    {
        IndicatorState.Fault => "fault",
        IndicatorState.None => "none",
        IndicatorState.Forward => "forward",
        IndicatorState.Reverse => "reverse",
        _ => "unknown",
    };

    /// <summary>The percentage shown on a suspect section.</summary>
    public static string Percent(double probability) =>
        probability >= 0.995 ? "100 %" : $"{Math.Round(probability * 100):0} %";
}
