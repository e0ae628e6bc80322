using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>
/// The most customers any switching can restore, by trying every combination of the switches that touch
/// the dead area (at most a few hundred on the small grids it is used on): radial, the isolated section
/// dead, and the load flow with the cold-load factor on every node that was without supply within every
/// limit. Switches of the live network stay as they are, as the planner leaves them.
/// </summary>
public static class ExhaustiveRestoration
{
    /// <summary>How many switches the search would try: those touching a node the trip left dead.</summary>
    public static int Domain(Grid grid, Incident incident) => DomainOf(grid, incident, out _).Count;

    public static (int Customers, IReadOnlyList<SwitchId> Closed) Best(Grid grid, Incident incident, SectionId isolated, double coldLoadFactor, double voltageLimitPu, int maxSwitches = 12)
    {
        var graph = new NetworkGraph(grid);
        var start = SwitchStates.AfterTrip(grid, incident);
        var domain = DomainOf(grid, incident, out var deadAtStart);
        if (domain.Count > maxSwitches)
        {
            throw new ArgumentException($"{domain.Count} switches: too many for an exhaustive search", nameof(grid));
        }

        var factors = Enumerable.Range(0, grid.Nodes.Length).Select(v => deadAtStart.Contains(v) ? coldLoadFactor : 1.0).ToArray();
        var segments = graph.Sections[isolated].Segments.Select(grid.SegmentIndex).ToList();
        var best = (Customers: -1, Closed: (IReadOnlyList<SwitchId>)[]);
        for (var mask = 0; mask < 1 << domain.Count; mask++)
        {
            var states = start;
            for (var k = 0; k < domain.Count; k++)
            {
                states = states.With(grid.Switches[domain[k]].Id, (mask & (1 << k)) != 0 ? SwitchPosition.Closed : SwitchPosition.Open);
            }

            if (!graph.TryEnergise(states, out var network, out _) || segments.Any(network.IsSegmentEnergised) || !WithinLimits(grid, network, factors, voltageLimitPu))
            {
                continue;
            }

            var customers = deadAtStart.Where(network.IsEnergised).Sum(v => grid.Nodes[v].Customers);
            if (customers > best.Customers)
            {
                best = (customers, [.. domain.Where((_, k) => (mask & (1 << k)) != 0).Select(i => grid.Switches[i].Id)]);
            }
        }

        return best;
    }

    private static List<int> DomainOf(Grid grid, Incident incident, out HashSet<int> deadAtStart)
    {
        var graph = new NetworkGraph(grid);
        var before = graph.Energise(SwitchStates.AtFaultTime(grid, incident));
        var after = graph.Energise(SwitchStates.AfterTrip(grid, incident));
        var dead = Enumerable.Range(0, grid.Nodes.Length).Where(v => before.IsEnergised(v) && !after.IsEnergised(v)).ToHashSet();
        deadAtStart = dead;
        return [.. Enumerable.Range(0, grid.Switches.Length)
            .Where(i => dead.Contains(grid.NodeIndex(grid.Switches[i].From)) || dead.Contains(grid.NodeIndex(grid.Switches[i].To)))];
    }

    /// <summary>Every live segment within its ampacity, every live node at or above the limit, every transformer within its rating.</summary>
    public static bool WithinLimits(Grid grid, EnergisedNetwork network, double[] factors, double voltageLimitPu)
    {
        var flow = RadialLoadFlow.Solve(network, factors);
        if (!flow.Converged)
        {
            return false;
        }

        for (var s = 0; s < grid.Segments.Length; s++)
        {
            if (flow.SegmentCurrentA[s] > grid.LineTypeOf(grid.Segments[s]).AmpacityA)
            {
                return false;
            }
        }

        for (var v = 0; v < grid.Nodes.Length; v++)
        {
            if (network.IsEnergised(v) && flow.VoltagePu[v] < voltageLimitPu)
            {
                return false;
            }
        }

        return grid.Substations.Select((s, i) => s.TransformerRatedMva is not { } mva || flow.SubstationLoadMva[i] <= mva).All(ok => ok);
    }
}
