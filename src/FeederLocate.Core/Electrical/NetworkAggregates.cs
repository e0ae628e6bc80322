using System.Numerics;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Electrical;

/// <summary>
/// Electrical sums over an energised network: per node the positive- and zero-sequence series
/// impedance of the path from its bus (Ω, source excluded) and the phase-to-earth capacitance of
/// everything fed through it (F per phase); per substation the capacitance of its whole galvanic
/// network. One pass down and one up the feed order.
/// </summary>
public sealed class NetworkAggregates
{
    private readonly Complex[] _z1FromBusOhm;
    private readonly Complex[] _z0FromBusOhm;
    private readonly double[] _subtreeC0F;
    private readonly double[] _totalC0F;

    private NetworkAggregates(EnergisedNetwork network)
    {
        Network = network;
        var grid = network.Grid;
        _z1FromBusOhm = new Complex[grid.Nodes.Length];
        _z0FromBusOhm = new Complex[grid.Nodes.Length];
        _subtreeC0F = new double[grid.Nodes.Length];
        _totalC0F = new double[grid.Substations.Length];
        var order = network.FeedOrder;
        foreach (var v in order)
        {
            var u = network.ParentOf(v);
            if (u < 0)
            {
                continue;
            }

            var edge = network.FeedingEdgeOf(v);
            if (edge.Kind == EdgeKind.Segment)
            {
                var segment = grid.Segments[edge.Index];
                var type = grid.LineTypeOf(segment);
                _z1FromBusOhm[v] = _z1FromBusOhm[u] + new Complex(type.R1OhmPerKm, type.X1OhmPerKm) * segment.LengthKm;
                _z0FromBusOhm[v] = _z0FromBusOhm[u] + new Complex(type.R0OhmPerKm, type.X0OhmPerKm) * segment.LengthKm;
                _subtreeC0F[v] = Units.FaradsPerKm(type.C0NfPerKm) * segment.LengthKm;
            }
            else
            {
                _z1FromBusOhm[v] = _z1FromBusOhm[u];
                _z0FromBusOhm[v] = _z0FromBusOhm[u];
            }
        }

        for (var i = order.Length - 1; i >= 0; i--)
        {
            var v = order[i];
            if (network.ParentOf(v) is var p and >= 0)
            {
                _subtreeC0F[p] += _subtreeC0F[v];
            }
            else
            {
                _totalC0F[network.SubstationIndexOf(v)] = _subtreeC0F[v];
            }
        }
    }

    public EnergisedNetwork Network { get; }

    /// <summary>The sums for <paramref name="network"/>.</summary>
    public static NetworkAggregates Of(EnergisedNetwork network)
    {
        ArgumentNullException.ThrowIfNull(network);
        return new NetworkAggregates(network);
    }

    /// <summary>Sum of r1 + j·x1 over the energised path from the bus to the node, Ω (source excluded).</summary>
    public Complex PositiveSequencePathOhm(int node) => _z1FromBusOhm[node];

    /// <summary>Sum of r0 + j·x0 over the energised path from the bus to the node, Ω.</summary>
    public Complex ZeroSequencePathOhm(int node) => _z0FromBusOhm[node];

    /// <summary>Phase-to-earth capacitance, F per phase, of every segment fed through the node (including the edge into it).</summary>
    public double CapacitanceAtOrBeyondF(int node) => _subtreeC0F[node];

    /// <summary>Phase-to-earth capacitance, F per phase, of every energised segment galvanically connected to the substation's bus.</summary>
    public double TotalCapacitanceF(int substation) => _totalC0F[substation];
}
