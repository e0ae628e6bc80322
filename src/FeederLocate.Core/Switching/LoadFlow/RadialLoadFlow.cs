using System.Collections.Immutable;
using System.Numerics;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Backward/forward sweep load flow of a radial energised network, per phase: constant power at every
/// node (loadKw, loadKvar; power factor 0.95 lagging where loadKvar is absent), segment impedance
/// (r1 + j·x1)·length, switches ideal, every busbar at 1.0 pu. The method is the textbook sweep for
/// radial distribution networks (common practice).
/// </summary>
public static class RadialLoadFlow
{
    /// <summary>Power factor of a node load that gives no loadKvar (0.95 lagging, common practice).</summary>
    public const double DefaultPowerFactor = 0.95;

    /// <summary>Voltage below which the sweep is taken to have collapsed, pu.</summary>
    private const double CollapsePu = 0.3;

    /// <summary>
    /// Solves the load flow. <paramref name="loadFactors"/> multiplies each node's load (indexed as the
    /// grid's nodes; null means 1 everywhere), for example the cold-load factor on nodes that were dead.
    /// </summary>
    /// <param name="tolerancePu">Largest voltage change between sweeps at which it stops, pu (&gt; 0).</param>
    public static LoadFlowResult Solve(EnergisedNetwork network, IReadOnlyList<double>? loadFactors = null, int maxIterations = 60, double tolerancePu = 1e-8)
    {
        ArgumentNullException.ThrowIfNull(network);
        ArgumentOutOfRangeException.ThrowIfLessThan(maxIterations, 1);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(tolerancePu);
        var grid = network.Grid;
        if (loadFactors is not null && loadFactors.Count != grid.Nodes.Length)
        {
            throw new ArgumentException($"load factors: one per node ({grid.Nodes.Length}), got {loadFactors.Count}", nameof(loadFactors));
        }

        var order = network.FeedOrder;
        var n = grid.Nodes.Length;
        var baseV = new double[n];
        var loadVa = new Complex[n];
        var branchZ = new Complex[n];
        var voltage = new Complex[n];
        var current = new Complex[n];
        var tanPhi = Math.Tan(Math.Acos(DefaultPowerFactor));
        foreach (var v in order)
        {
            var substation = grid.Substations[network.SubstationIndexOf(v)];
            baseV[v] = Units.PhaseVoltageV(substation.NominalVoltageKv);
            voltage[v] = baseV[v];
            var node = grid.Nodes[v];
            var factor = loadFactors?[v] ?? 1.0;
            var q = node.LoadKvar ?? node.LoadKw * tanPhi;
            loadVa[v] = new Complex(node.LoadKw, q) * (1e3 / 3) * factor;
            var edge = network.FeedingEdgeOf(v);
            if (!edge.IsNone && edge.Kind == EdgeKind.Segment)
            {
                var segment = grid.Segments[edge.Index];
                var type = grid.LineTypeOf(segment);
                branchZ[v] = new Complex(type.R1OhmPerKm, type.X1OhmPerKm) * segment.LengthKm;
            }
        }

        var converged = false;
        var iterations = 0;
        while (iterations < maxIterations && !converged)
        {
            iterations++;

            // Backward: each node's load current plus everything fed through it, leaves first.
            for (var k = order.Length - 1; k >= 0; k--)
            {
                var v = order[k];
                current[v] += Complex.Conjugate(loadVa[v] / voltage[v]);
                if (network.ParentOf(v) is var p and >= 0)
                {
                    current[p] += current[v];
                }
            }

            // Forward: each node's voltage from its parent's, less the drop on the edge into it.
            var largestChangePu = 0.0;
            var collapsed = false;
            foreach (var v in order)
            {
                if (network.ParentOf(v) is not (var p and >= 0))
                {
                    continue;
                }

                var next = voltage[p] - (branchZ[v] * current[v]);
                largestChangePu = Math.Max(largestChangePu, Complex.Abs(next - voltage[v]) / baseV[v]);
                voltage[v] = next;
                collapsed |= !(Complex.Abs(next) / baseV[v] >= CollapsePu);
            }

            if (collapsed)
            {
                break;
            }

            converged = largestChangePu < tolerancePu;
            if (!converged)
            {
                Array.Clear(current);
            }
        }

        var voltagePu = Enumerable.Repeat(double.NaN, n).ToArray();
        foreach (var v in order)
        {
            voltagePu[v] = Complex.Abs(voltage[v]) / baseV[v];
        }

        var segmentCurrent = new double[grid.Segments.Length];
        var substationMva = new double[grid.Substations.Length];
        foreach (var v in order)
        {
            var edge = network.FeedingEdgeOf(v);
            if (edge.IsNone)
            {
                continue;
            }

            if (edge.Kind == EdgeKind.Segment)
            {
                segmentCurrent[edge.Index] = Complex.Abs(current[v]);
            }
        }

        // |S| out of each bus: 3·V·conj(I) summed over its branches as complex power, then the magnitude.
        var busPower = new Complex[grid.Substations.Length];
        foreach (var v in order)
        {
            var p = network.ParentOf(v);
            if (p >= 0 && network.ParentOf(p) < 0)
            {
                busPower[network.SubstationIndexOf(v)] += 3 * voltage[p] * Complex.Conjugate(current[v]);
            }
        }

        for (var s = 0; s < substationMva.Length; s++)
        {
            substationMva[s] = Complex.Abs(busPower[s]) / 1e6;
        }

        return new LoadFlowResult([.. voltagePu], [.. segmentCurrent], [.. substationMva], converged, iterations);
    }
}
