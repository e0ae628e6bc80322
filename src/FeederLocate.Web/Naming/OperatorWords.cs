using System.Globalization;
using System.Text.RegularExpressions;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Web.Naming;

/// <summary>
/// The words and numbers the pages show people: actions in plain words, sections by their feeder and
/// bounding devices, numbers rounded and grouped. The file formats and the API keep their own words and ids.
/// </summary>
public static partial class OperatorWords
{
    private static readonly CultureInfo Numbers = CultureInfo.InvariantCulture;

    public static string Action(StepAction action) => action switch
    {
        StepAction.Open => "open",
        StepAction.Close => "close",
        StepAction.Dispatch => "send a crew to",
        StepAction.Patrol => "patrol",
        StepAction.Verify => "verify",
        StepAction.Replace => "replace the fuse",
        StepAction.Lock => "lock and tag (or block remote control of)",
        StepAction.ProveDead => "prove dead",
        StepAction.Earth => "earth",
        StepAction.Permit => "issue a permit for",
        StepAction.RemoveEarth => "remove the earths from",
        StepAction.Unlock => "remove the lock and tag from",
        _ => action.ToString().ToLowerInvariant(),
    };

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
    public static string Count(double value) => Math.Round(value).ToString("#,0", Numbers);

    /// <summary>"none", "under 1" or the rounded count, for an estimate such as customer minutes.</summary>
    public static string Estimate(double value) => value <= 0 ? "none" : value < 1 ? "under 1" : $"about {Count(value)}";

    /// <summary>A measured value with sensible digits: 1,234 A; 56.7 A; 3.45 A.</summary>
    public static string Measured(double value) => Math.Abs(value) switch
    {
        >= 1000 => value.ToString("#,0", Numbers),
        >= 10 => value.ToString("0.0", Numbers),
        _ => value.ToString("0.00", Numbers),
    };

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
    public static string WithSectionNames(string text, SectionNames? names)
    {
        ArgumentNullException.ThrowIfNull(text);
        return names is null ? text : SectionIdInText().Replace(text, m =>
        {
            var id = new SectionId(m.Value);
            return names.All.ContainsKey(id) ? names[id] : m.Value;
        });
    }

    [GeneratedRegex(@"SEC-[A-Za-z0-9_.\-]*[A-Za-z0-9_]")]
    private static partial Regex SectionIdInText();
}
