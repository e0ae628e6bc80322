using System.Collections.Immutable;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The healthy part of the network without supply after the isolation: the zones supplied at fault time
/// and dead now, other than the suspect, grouped into islands joined by closed switches.
/// </summary>
internal sealed class DeadArea
{
    public DeadArea(PlanningContext ctx, IsolationResult isolation)
    {
        var zones = ctx.Zones;
        var network = isolation.AfterNetwork;
        var states = isolation.After;
        var lost = new bool[zones.All.Length];
        foreach (var z in zones.All)
        {
            lost[z.Index] = !ctx.IsIsolated(z.Index) && !ctx.ZoneLive(network, z.Index) && z.Nodes.Any(v => ctx.Affected[v]);
        }

        var island = Enumerable.Repeat(-1, zones.All.Length).ToArray();
        var count = 0;
        for (var z = 0; z < lost.Length; z++)
        {
            if (!lost[z] || island[z] >= 0)
            {
                continue;
            }

            var queue = new Queue<int>([z]);
            island[z] = count;
            while (queue.TryDequeue(out var u))
            {
                foreach (var device in zones.All[u].Switches)
                {
                    var w = zones.Across(device, u);
                    if (states.IsClosed(device) && lost[w] && island[w] < 0)
                    {
                        island[w] = count;
                        queue.Enqueue(w);
                    }
                }
            }

            count++;
        }

        Lost = [.. lost];
        IslandOf = [.. island];
        IslandCount = count;

        // Each island touches the suspect through one boundary switch (radial at fault time).
        var boundary = Enumerable.Repeat(-1, count).ToArray();
        foreach (var device in zones.All[ctx.SuspectZone].Switches)
        {
            var w = zones.Across(device, ctx.SuspectZone);
            if (w != ctx.SuspectZone && lost[w] && boundary[island[w]] < 0)
            {
                boundary[island[w]] = device;
            }
        }

        SuspectBoundaryOfIsland = [.. boundary];
        Network = network;
        States = states;
    }

    public ImmutableArray<bool> Lost { get; }

    public ImmutableArray<int> IslandOf { get; }

    public int IslandCount { get; }

    /// <summary>Per island: the suspect's boundary switch that touches it, or -1.</summary>
    public ImmutableArray<int> SuspectBoundaryOfIsland { get; }

    public EnergisedNetwork Network { get; }

    public SwitchStates States { get; }
}
