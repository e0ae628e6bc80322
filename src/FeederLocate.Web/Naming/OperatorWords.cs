using System.Globalization;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Web.Naming;

/// <summary>
/// The words and numbers the pages show people: actions in plain words, sections by their feeder and
/// bounding devices, numbers rounded and grouped. The file formats and the API keep their own words and ids.
/// </summary>
public static class OperatorWords
{
    private static readonly CultureInfo Numbers = CultureInfo.InvariantCulture;

    /// <summary>A step's action in plain words ("prove dead"): the words the command line and the handover use too.</summary>
    public static string Action(StepAction action) => FeederLocate.Application.Naming.StepWords.Action(action);

    public static string Quantity(string quantity) => quantity switch
    {
        "phaseCurrentA" => "phase current (A)",
        "residualCurrentA" => "residual current (A)",
        "neutralVoltageV" => "neutral voltage U0 (V)",
        _ => quantity,
    };

    /// <summary>A fault type in words, with its short form: "phase to earth (LG)".</summary>
    public static string FaultType(FeederLocate.Core.Evidence.FaultType type) => type switch
    {
        Core.Evidence.FaultType.LG => "phase to earth (LG)",
        Core.Evidence.FaultType.LL => "phase to phase (LL)",
        Core.Evidence.FaultType.LLG => "two phases to earth (LLG)",
        _ => "three-phase (LLL)",
    };

    /// <summary>A whole count with thousands grouped: 12,345.</summary>
    public static string Count(double value) => FeederLocate.Application.Naming.Figures.Count(value);

    /// <summary>"none", "under 1" or the rounded count, for an estimate such as customer minutes.</summary>
    public static string Estimate(double value) => value <= 0 ? "none" : value < 1 ? "under 1" : $"about {Count(value)}";

    /// <summary>A measured value with sensible digits: 1,234 A; 56.7 A; 3.45 A.</summary>
    public static string Measured(double value) => Math.Abs(value) switch
    {
        >= 1000 => value.ToString("#,0", Numbers),
        >= 10 => value.ToString("0.0", Numbers),
        _ => value.ToString("0.00", Numbers),
    };

    /// <summary>
    /// A figure to three significant digits, grouped, never in exponent form: 12,300; 1,230; 123; 12.3; 1.23; 0.0123.
    /// </summary>
    public static string Figure(double value) => FeederLocate.Application.Naming.Figures.Significant(value);

    /// <summary>A share as a percentage with <paramref name="decimals"/> decimals: "4.5 %".</summary>
    public static string Percent(double share, int decimals = 1) =>
        (100 * share).ToString(decimals == 0 ? "0" : "0." + new string('0', decimals), Numbers) + " %";

    /// <summary>A switch device's kind in words.</summary>
    public static string Kind(SwitchKind kind) => kind switch
    {
        SwitchKind.Breaker => "breaker",
        SwitchKind.Recloser => "recloser",
        SwitchKind.LoadBreakSwitch => "load-break switch",
        SwitchKind.Disconnector => "disconnector",
        _ => "fuse",
    };

    /// <summary>The text with every section id in it replaced by the section's name.</summary>
    public static string WithSectionNames(string text, SectionNames? names) => WithNames(text, names, null);

    /// <summary>
    /// The text with every section and segment id in it (a whole word: "FPI-S108" is an indicator's name and
    /// stays) replaced by its operator's name.
    /// </summary>
    public static string WithNames(string text, SectionNames? sections, SegmentNames? segments) => NamesInText.With(text, sections, segments);

    /// <summary>A segment by its name, or its id where no names are given.</summary>
    public static string Segment(SegmentId id, SegmentNames? names) => names?[id] ?? id.Value;

    /// <summary>A section by its name, or its id where no names are given.</summary>
    public static string Section(SectionId id, SectionNames? names) => names?[id] ?? id.Value;

    /// <summary>A fault resistance for people: "0.5 Ω", "12 Ω", "350 Ω", "1.2 kΩ".</summary>
    public static string Resistance(double ohm) => FeederLocate.Application.Naming.Figures.Resistance(ohm);
}
