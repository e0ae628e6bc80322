using System.Globalization;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The capacity and voltage check of a live network: the radial load flow with the cold-load factor on
/// the nodes that were without supply, then every live segment at most its ampacityA, every live node at
/// or above the voltage limit, and every substation within its transformerRatedMva where given.
/// </summary>
internal sealed class SupplyLimits(double voltageLimitPu, double[] loadFactors)
{
    public double VoltageLimitPu { get; } = voltageLimitPu;

    /// <summary>Per node load multiplier: the cold-load factor where the node was without supply, else 1.</summary>
    public IReadOnlyList<double> LoadFactors { get; } = loadFactors;

    /// <summary>
    /// Checks the substations in <paramref name="substations"/> (null: all); with <paramref name="feederHeads"/>,
    /// only the nodes and segments at or beyond those nodes (the feeders a restoration loads), so that a
    /// limit already broken on another feeder of the same substation does not forbid it.
    /// </summary>
    public SupplyVerdict Check(EnergisedNetwork network, IReadOnlySet<int>? substations = null, IReadOnlyCollection<int>? feederHeads = null)
    {
        var grid = network.Grid;
        var flow = RadialLoadFlow.Solve(network, LoadFactors);
        string? violation = flow.Converged ? null : "the load flow does not converge (voltage collapse)";
        var minV = double.PositiveInfinity;
        var minNode = -1;
        var maxLoading = 0.0;
        var maxSegment = -1;
        foreach (var v in network.FeedOrder)
        {
            if ((substations is not null && !substations.Contains(network.SubstationIndexOf(v)))
                || (feederHeads is not null && !feederHeads.Any(h => network.IsAtOrBeyond(h, v))))
            {
                continue;
            }

            if (flow.VoltagePu[v] < minV)
            {
                minV = flow.VoltagePu[v];
                minNode = v;
            }

            var edge = network.FeedingEdgeOf(v);
            if (!edge.IsNone && edge.Kind == EdgeKind.Segment)
            {
                var segment = grid.Segments[edge.Index];
                var loading = 100 * flow.SegmentCurrentA[edge.Index] / grid.LineTypeOf(segment).AmpacityA;
                if (loading > maxLoading)
                {
                    maxLoading = loading;
                    maxSegment = edge.Index;
                }
            }
        }

        if (violation is null && maxSegment >= 0 && maxLoading > 100)
        {
            var s = grid.Segments[maxSegment];
            violation = $"segment {s.Id} would carry {F(flow.SegmentCurrentA[maxSegment])} A, above its ampacity {F(grid.LineTypeOf(s).AmpacityA)} A";
        }

        if (violation is null && minNode >= 0 && minV < VoltageLimitPu)
        {
            violation = $"node {grid.Nodes[minNode].Id} would be at {minV.ToString("0.000", CultureInfo.InvariantCulture)} pu, below {VoltageLimitPu.ToString("0.00", CultureInfo.InvariantCulture)} pu";
        }

        for (var s = 0; violation is null && s < grid.Substations.Length; s++)
        {
            var rated = grid.Substations[s].TransformerRatedMva;
            if ((substations is null || substations.Contains(s)) && rated is { } mva && flow.SubstationLoadMva[s] > mva)
            {
                violation = $"substation {grid.Substations[s].Id} would carry {F(flow.SubstationLoadMva[s])} MVA, above its transformer rating {F(mva)} MVA";
            }
        }

        return new SupplyVerdict(violation, minNode >= 0 ? minV : 1.0, minNode, maxLoading, maxSegment);
    }

    /// <summary>The node just below the bus on the path to <paramref name="node"/>: the head of its feeder.</summary>
    public static int FeederHeadOf(EnergisedNetwork network, int node)
    {
        var v = node;
        while (network.ParentOf(v) is var p and >= 0 && network.ParentOf(p) >= 0)
        {
            v = p;
        }

        return v;
    }

    private static string F(double value) => value.ToString("0.#", CultureInfo.InvariantCulture);
}
