using System.Globalization;
using System.Numerics;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The supply check of one restoration on its own, without building the whole network again: the donor
/// feeder as it is in <c>dead</c> plus the group of zones a restoring switch picks up, solved by the
/// same backward/forward sweep as <see cref="RadialLoadFlow"/> (busbar at 1.0 pu, so the feeders of a
/// bus do not affect each other's voltages and currents). The substation's load adds the complex power
/// of its other feeders, each solved once. The verdict equals <see cref="SupplyLimits.Check"/> limited
/// to the donor and that feeder head.
/// </summary>
internal sealed class RestorationFlow(PlanningContext ctx, EnergisedNetwork dead, SupplyLimits limits)
{
    private const int MaxIterations = 60;
    private const double TolerancePu = 1e-8;
    private const double CollapsePu = 0.3;

    private readonly Dictionary<int, List<int>> _feederNodes = [];
    private readonly Dictionary<int, Complex> _feederPowerVa = [];

    /// <summary>
    /// The verdict for the donor feeder headed by <paramref name="head"/> when switch <paramref name="source"/>
    /// closes from <paramref name="liveNode"/> onto <paramref name="deadNode"/>, picking up the zones in <paramref name="group"/>.
    /// </summary>
    public SupplyVerdict Check(int head, int source, int liveNode, int deadNode, IReadOnlySet<int> group)
    {
        var grid = ctx.Grid;
        var donor = dead.SubstationIndexOf(liveNode);

        // Closing a feeder breaker at the bus makes the group a feeder of its own; the bus's other feeders only add to its load.
        var atBus = dead.ParentOf(liveNode) < 0;
        var nodes = atBus ? [] : new List<int>(FeederNodes(head));
        var parentOf = new Dictionary<int, int>();
        var segmentInto = new Dictionary<int, int>();
        foreach (var v in nodes)
        {
            var edge = dead.FeedingEdgeOf(v);
            parentOf[v] = v == head ? -1 : dead.ParentOf(v);
            segmentInto[v] = edge.Kind == EdgeKind.Segment ? edge.Index : -1;
        }

        // The group, node by node from the dead end of the source, over segments and closed switches inside it.
        parentOf[deadNode] = atBus ? -1 : liveNode;
        segmentInto[deadNode] = -1;
        nodes.Add(deadNode);
        for (var k = nodes.Count - 1; k < nodes.Count; k++)
        {
            var u = nodes[k];
            foreach (var (edge, w) in ctx.Graph.EdgesAt(u))
            {
                if (parentOf.ContainsKey(w) || !group.Contains(ctx.Zones.ZoneOfNode(w))
                    || (edge.Kind == EdgeKind.Switch && (edge.Index == source || !dead.States.IsClosed(edge.Index))))
                {
                    continue;
                }

                parentOf[w] = u;
                segmentInto[w] = edge.Kind == EdgeKind.Segment ? edge.Index : -1;
                nodes.Add(w);
            }
        }

        var solved = Solve(donor, nodes, parentOf, segmentInto);
        return Verdict(donor, atBus ? deadNode : head, nodes, segmentInto, solved);
    }

    private List<int> FeederNodes(int head)
    {
        if (!_feederNodes.TryGetValue(head, out var list))
        {
            list = [.. dead.FeedOrder.Where(v => dead.IsAtOrBeyond(head, v))];
            _feederNodes[head] = list;
        }

        return list;
    }

    private Complex FeederPowerVa(int head)
    {
        if (!_feederPowerVa.TryGetValue(head, out var power))
        {
            var nodes = FeederNodes(head);
            var parentOf = nodes.ToDictionary(v => v, v => v == head ? -1 : dead.ParentOf(v));
            var segmentInto = nodes.ToDictionary(v => v, v => dead.FeedingEdgeOf(v) is { Kind: EdgeKind.Segment } e ? e.Index : -1);
            power = Solve(dead.SubstationIndexOf(head), nodes, parentOf, segmentInto).PowerVa;
            _feederPowerVa[head] = power;
        }

        return power;
    }

    private sealed record Solution(Dictionary<int, Complex> Voltage, Dictionary<int, Complex> Current, Complex PowerVa, bool Converged);

    /// <summary>The sweep over <paramref name="nodes"/> (parents before children; the first is the feeder head, fed from the bus).</summary>
    private Solution Solve(int substation, List<int> nodes, Dictionary<int, int> parentOf, Dictionary<int, int> segmentInto)
    {
        var grid = ctx.Grid;
        var baseV = grid.Substations[substation].NominalVoltageKv * 1e3 / Math.Sqrt(3);
        var tanPhi = Math.Tan(Math.Acos(RadialLoadFlow.DefaultPowerFactor));
        var voltage = new Dictionary<int, Complex>(nodes.Count);
        var current = new Dictionary<int, Complex>(nodes.Count);
        var load = new Dictionary<int, Complex>(nodes.Count);
        var z = new Dictionary<int, Complex>(nodes.Count);
        foreach (var v in nodes)
        {
            var node = grid.Nodes[v];
            var q = node.LoadKvar ?? node.LoadKw * tanPhi;
            load[v] = new Complex(node.LoadKw, q) * (1e3 / 3) * limits.LoadFactors[v];
            voltage[v] = baseV;
            var s = segmentInto[v];
            z[v] = s >= 0 ? new Complex(grid.LineTypeOf(grid.Segments[s]).R1OhmPerKm, grid.LineTypeOf(grid.Segments[s]).X1OhmPerKm) * grid.Segments[s].LengthKm : Complex.Zero;
        }

        var converged = false;
        for (var iteration = 0; iteration < MaxIterations && !converged; iteration++)
        {
            foreach (var v in nodes)
            {
                current[v] = Complex.Zero;
            }

            for (var k = nodes.Count - 1; k >= 0; k--)
            {
                var v = nodes[k];
                current[v] += Complex.Conjugate(load[v] / voltage[v]);
                if (parentOf[v] is var p and >= 0)
                {
                    current[p] += current[v];
                }
            }

            var largest = 0.0;
            var collapsed = false;
            foreach (var v in nodes)
            {
                var upstream = parentOf[v] is var p and >= 0 ? voltage[p] : baseV;
                var next = upstream - (z[v] * current[v]);
                largest = Math.Max(largest, Complex.Abs(next - voltage[v]) / baseV);
                voltage[v] = next;
                collapsed |= !(Complex.Abs(next) / baseV >= CollapsePu);
            }

            if (collapsed)
            {
                break;
            }

            converged = largest < TolerancePu;
        }

        return new Solution(voltage, current, 3 * baseV * Complex.Conjugate(current[nodes[0]]), converged);
    }

    private SupplyVerdict Verdict(int donor, int head, List<int> nodes, Dictionary<int, int> segmentInto, Solution solved)
    {
        var grid = ctx.Grid;
        var baseV = grid.Substations[donor].NominalVoltageKv * 1e3 / Math.Sqrt(3);
        string? violation = solved.Converged ? null : "the load flow does not converge (voltage collapse)";
        var minV = double.PositiveInfinity;
        var minNode = -1;
        var maxLoading = 0.0;
        var maxSegment = -1;
        var maxCurrent = 0.0;
        foreach (var v in nodes)
        {
            var pu = Complex.Abs(solved.Voltage[v]) / baseV;
            if (pu < minV)
            {
                minV = pu;
                minNode = v;
            }

            if (segmentInto[v] is var s and >= 0)
            {
                var amps = Complex.Abs(solved.Current[v]);
                var loading = 100 * amps / grid.LineTypeOf(grid.Segments[s]).AmpacityA;
                if (loading > maxLoading)
                {
                    maxLoading = loading;
                    maxSegment = s;
                    maxCurrent = amps;
                }
            }
        }

        if (violation is null && maxSegment >= 0 && maxLoading > 100)
        {
            var s = grid.Segments[maxSegment];
            violation = $"segment {s.Id} would carry {F(maxCurrent)} A, above its ampacity {F(grid.LineTypeOf(s).AmpacityA)} A";
        }

        if (violation is null && minNode >= 0 && minV < limits.VoltageLimitPu)
        {
            violation = $"node {grid.Nodes[minNode].Id} would be at {minV.ToString("0.000", CultureInfo.InvariantCulture)} pu, below {limits.VoltageLimitPu.ToString("0.00", CultureInfo.InvariantCulture)} pu";
        }

        if (violation is null && grid.Substations[donor].TransformerRatedMva is { } rated)
        {
            var total = solved.PowerVa;
            foreach (var other in OtherFeederHeads(donor, head))
            {
                total += FeederPowerVa(other);
            }

            var mva = Complex.Abs(total) / 1e6;
            if (mva > rated)
            {
                violation = $"substation {grid.Substations[donor].Id} would carry {F(mva)} MVA, above its transformer rating {F(rated)} MVA";
            }
        }

        return new SupplyVerdict(violation, minNode >= 0 ? minV : 1.0, minNode, maxLoading, maxSegment);
    }

    /// <summary>The heads of the donor's other live feeders: the nodes fed straight from its bus.</summary>
    private IEnumerable<int> OtherFeederHeads(int donor, int head)
    {
        var bus = ctx.Grid.NodeIndex(ctx.Grid.Substations[donor].BusNode);
        return dead.FeedOrder.Where(v => v != head && dead.ParentOf(v) == bus);
    }

    private static string F(double value) => value.ToString("0.#", CultureInfo.InvariantCulture);
}
