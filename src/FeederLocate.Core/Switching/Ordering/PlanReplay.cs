using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>What replaying a plan's steps on the model gives.</summary>
/// <param name="Violations">Device rules broken by a step (the planner's own check: empty for every plan it returns).</param>
internal sealed record ReplayOutcome(double CustomerMinutes, int Restored, int Unserved, EnergisedNetwork Final, IReadOnlyList<string> Violations);

/// <summary>
/// Carries out a plan's steps on the model from the start state, checking each against the device rules,
/// and counts customers and customer minutes (IEEE 1366 CMI) over the plan.
/// </summary>
internal static class PlanReplay
{
    public static ReplayOutcome Run(PlanningContext ctx, IReadOnlyList<SwitchingStep> steps)
    {
        var grid = ctx.Grid;
        var states = ctx.StartStates;
        var network = ctx.StartNetwork;
        var violations = new List<string>();
        var everDead = new bool[grid.Nodes.Length];
        Mark(ctx, network, everDead);
        var changes = new List<SupplyChange>();
        var horizon = TimeSpan.Zero;
        var atStart = Without(ctx, network);
        foreach (var step in steps)
        {
            if (step.Device is not { } id || step.Action is not (StepAction.Open or StepAction.Close or StepAction.Replace))
            {
                continue;
            }

            var index = grid.SwitchIndex(id);
            var device = grid.Switches[index];
            var fromLive = network.IsEnergised(device.From);
            var toLive = network.IsEnergised(device.To);
            if (step.Action == StepAction.Replace)
            {
                if (device.Kind != SwitchKind.Fuse || fromLive || toLive || states.IsClosed(index))
                {
                    violations.Add($"step {step.Order}: a fuse is replaced only when open with both nodes dead ({id})");
                }

                continue;
            }

            var problem = StepCheck.Problem(ctx, states, network, index, step.Action == StepAction.Open, out var next, out var nextNetwork);
            if (problem is not null)
            {
                violations.Add($"step {step.Order}: {problem}");
            }

            if (nextNetwork is null)
            {
                continue;
            }

            states = next;
            network = nextNetwork;
            Mark(ctx, network, everDead);
            changes.Add(new SupplyChange(step.At, Without(ctx, network)));
            horizon = step.At;
        }

        var restored = 0;
        var unserved = 0;
        for (var v = 0; v < grid.Nodes.Length; v++)
        {
            if (!ctx.Affected[v])
            {
                continue;
            }

            if (!network.IsEnergised(v))
            {
                unserved += grid.Nodes[v].Customers;
            }
            else if (everDead[v])
            {
                restored += grid.Nodes[v].Customers;
            }
        }

        return new ReplayOutcome(CustomerMinutes.Interrupted(atStart, changes, horizon), restored, unserved, network, violations);
    }

    private static void Mark(PlanningContext ctx, EnergisedNetwork network, bool[] everDead)
    {
        for (var v = 0; v < everDead.Length; v++)
        {
            everDead[v] |= ctx.Affected[v] && !network.IsEnergised(v);
        }
    }

    private static int Without(PlanningContext ctx, EnergisedNetwork network)
    {
        var count = 0;
        for (var v = 0; v < ctx.Grid.Nodes.Length; v++)
        {
            if (ctx.Affected[v] && !network.IsEnergised(v))
            {
                count += ctx.Grid.Nodes[v].Customers;
            }
        }

        return count;
    }
}
