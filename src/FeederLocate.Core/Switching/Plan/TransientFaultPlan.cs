using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The plan for a transient fault (a reclosure held): nothing is opened or closed; the crew patrols
/// where the ranking puts the fault, most likely first, reads the field indicators of the feeder, and
/// records the reclosing device's operation. No section is isolated and nobody is left without supply.
/// </summary>
internal static class TransientFaultPlan
{
    public static SwitchingPlan Build(PlanningContext ctx, Reclosing reclosing)
    {
        var grid = ctx.Grid;
        var options = ctx.Options;
        var ranking = ctx.Ranking!;
        var network = ctx.FaultTimeNetwork;
        var suspects = new List<(SectionId Id, double Probability)>();
        var mass = 0.0;
        foreach (var s in ranking.Sections)
        {
            if (mass >= options.SplitMassShare || suspects.Count == options.MaxTrialSuspects || s.Probability <= 0)
            {
                break;
            }

            suspects.Add((s.Id, s.Probability));
            mass += s.Probability;
        }

        var device = grid.SwitchIndex(reclosing.Device);
        var far = ctx.FarNodeOf(network, device);
        var read = ctx.Incident.Indications.Where(i => i.Source == IndicationSource.Field).Select(i => i.Indicator).ToHashSet();
        var fieldIndicators = grid.Indicators
            .Where(i => !i.Remote && !read.Contains(i.Id) && far >= 0 && network.IsEnergised(i.Node) && network.IsAtOrBeyond(far, grid.NodeIndex(i.Node)))
            .ToList();

        var arrival = options.DefaultTravelTime;
        var steps = new List<SwitchingStep>();
        void Add(StepAction action, SwitchId? id, NodeId? node, ImmutableArray<SegmentId> segments, TimeSpan at, string reason) =>
            steps.Add(new SwitchingStep(steps.Count + 1, action, id, node, segments, at, reason));

        var first = suspects.Count > 0 ? ctx.Graph.Sections[suspects[0].Id].Segments : [];
        Add(StepAction.Dispatch, null, null, first, TimeSpan.Zero,
            $"send a crew to patrol where the transient fault probably was: {Words.List(suspects.Select(s => $"{s.Id} ({Words.Probability(s.Probability)})"))}");
        foreach (var i in fieldIndicators)
        {
            Add(StepAction.Verify, null, i.Node, [i.Segment], arrival,
                $"read the field indicator {i.Id} on {i.Segment} at {i.Node} and reset it: its flag may show on which side the fault was");
        }

        foreach (var (id, p) in suspects)
        {
            Add(StepAction.Patrol, null, null, ctx.Graph.Sections[id].Segments, arrival,
                $"patrol section {id} ({Words.Probability(p)}): look for the cause of the transient fault (vegetation, damaged insulators or arresters, flashover marks, animals)");
        }

        Add(StepAction.Verify, reclosing.Device, null, [], arrival,
            $"record the reclosing of {reclosing.Device} ({reclosing.Attempts} reclosure{(reclosing.Attempts == 1 ? string.Empty : "s")}, the last held) and check its operation counter; no switching is needed");

        var limits = new SupplyLimits(options.VoltageLimitPu, [.. Enumerable.Repeat(1.0, grid.Nodes.Length)]);
        var final = limits.Check(network);
        return new SwitchingPlan(
            [.. steps],
            [],
            [.. suspects.Select(s => new PlanSection(s.Id, ctx.Graph.Sections[s.Id].Segments))],
            options.ColdLoadFactor ?? options.ColdLoadAt(TimeSpan.Zero),
            options.VoltageLimitPu,
            0,
            0,
            0,
            new FinalSupply(
                final.MinimumVoltagePu,
                final.MinimumVoltageNode >= 0 ? grid.Nodes[final.MinimumVoltageNode].Id : null,
                final.MaximumLoadingPercent,
                final.MaximumLoadingSegment >= 0 ? grid.Segments[final.MaximumLoadingSegment].Id : null),
            [],
            null,
            Cautions.All,
            [
                $"transient fault: a reclosure of {reclosing.Device} held, so the fault cleared itself; the plan opens and closes nothing and isolates no section",
                "customer minutes: the reclosing interruption lasted seconds (a momentary interruption, IEEE 1366) and is not counted",
                $"crews reach the suspects after {Words.Number(arrival.TotalMinutes)} min (the default travel time)",
            ]);
    }
}
