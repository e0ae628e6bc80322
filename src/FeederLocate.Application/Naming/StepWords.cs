using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Application.Naming;

/// <summary>
/// A switching step as people read it: the action in plain words, the device by its name, and segments by the
/// sections they lie in (named by feeder and bounding devices). The file formats and the JSON keep their own words and ids.
/// </summary>
public static class StepWords
{
    public static string Action(StepAction action) => action switch
    {
        StepAction.Open => "open",
        StepAction.Close => "close",
        StepAction.Dispatch => "send a crew to",
        StepAction.Patrol => "patrol",
        StepAction.Verify => "verify",
        StepAction.Replace => "replace the fuse",
        StepAction.Lock => "lock and tag",
        StepAction.ProveDead => "prove dead",
        StepAction.Earth => "earth",
        StepAction.Permit => "issue a permit for",
        StepAction.RemoveEarth => "remove the earths from",
        StepAction.Unlock => "remove the lock and tag from",
        _ => action.ToString().ToLowerInvariant(),
    };

    /// <summary>
    /// What the step acts on: its device, else the sections its segments lie in ("section A1: CB-A1 → LB-A1-3");
    /// the segments' own names where a segment is not on <paramref name="graph"/>.
    /// </summary>
    public static string Target(SwitchingStep step, NetworkGraph graph)
    {
        ArgumentNullException.ThrowIfNull(step);
        ArgumentNullException.ThrowIfNull(graph);
        if (step.Device is { } device)
        {
            return device.Value;
        }

        var grid = graph.Grid;
        if (step.Segments.IsDefaultOrEmpty)
        {
            return string.Empty;
        }

        if (step.Segments.Any(s => !grid.HasSegment(s)))
        {
            var segments = GridNames.Segments(graph);
            return string.Join(", ", step.Segments.Select(s => segments[s]));
        }

        var names = GridNames.Sections(graph);
        var sections = step.Segments.Select(s => graph.Sections.OfSegment(grid.SegmentIndex(s)).Id).Distinct().Select(s => names[s]).ToList();
        return $"{(sections.Count == 1 ? "section" : "sections")} {string.Join("; ", sections)}";
    }

    /// <summary>"3. prove dead section A1: LB-A1-3 → LB-A1-4": the step's number, its action in words and what it acts on.</summary>
    public static string Describe(SwitchingStep step, NetworkGraph graph) =>
        $"{step.Order}. {Action(step.Action)} {Target(step, graph)}".TrimEnd();
}
