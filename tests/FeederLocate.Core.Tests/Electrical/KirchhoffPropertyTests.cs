using System.Numerics;
using CsCheck;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Electrical;

/// <summary>
/// Residual currents of the reference model (DOMAIN.md) obey Kirchhoff's current law. Every segment of a
/// random synthetic grid carries an indicator at each end, so each node's edges are measured.
/// <para>
/// Why magnitudes suffice: the forward residual into a region B is the current its sinks draw, 3·Y0B·U0
/// (+ I_f when the fault lies in B). The sinks of the whole network sum to zero (I_f = −3·Y0bus·U0), so at a
/// node the forward currents into its edges sum to zero. Where the fault does not lie beyond a node, every
/// current into its downstream edges is 3·(jω + dω)·C·U0 with the same phase, so the magnitude read facing the
/// source equals the sum of the magnitudes read facing away, and a segment's two readings differ by its own
/// charging current. On an isolated network (YN = 0) I_f is in phase with them too, so the same holds
/// along the faulted path. Everything else is checked against the model's formula with complex values.
/// </para>
/// </summary>
public class KirchhoffPropertyTests
{
    private const double RelativeTolerance = 1e-9;

    private static readonly Gen<double> FaultResistanceOhm = Gen.OneOf<double>(Gen.Const(0.0), Gen.Double[0, 20], Gen.Double[0, 5000]);

    private static readonly Gen<EarthFaultDraw> Draws = Gen.Select(
        Gen.Int[5, 80], Gen.Int, Gen.Enum<GroundingScheme>(), Gen.Int[3, 40], Gen.Int[1, 6], Gen.Int[1, 2],
        Gen.Double[0, 1], Gen.Double[0, 1], FaultResistanceOhm, Gen.OneOf(FaultType.LG, FaultType.LLG),
        (segments, seed, scheme, perFeeder, perSwitch, substations, pick, position, rf, type) =>
            new EarthFaultDraw(new SyntheticGridOptions(segments, seed, scheme, 1.0, perFeeder, perSwitch, substations), pick, position, rf, type));

    [Fact]
    public void Residual_currents_balance_at_every_node_of_random_grids()
    {
        Draws.Sample(draw =>
        {
            var c = Compute(draw);

            foreach (var node in Enumerable.Range(0, c.Grid.Nodes.Length).Where(v => c.Tree.SubstationOf(v) == c.Substation))
            {
                var parent = c.Tree.ParentOf(node);
                if (parent < 0 || c.ParentSegment[node] < 0)
                {
                    continue;
                }

                var towardSource = c.Reading(c.ParentSegment[node], node);
                if (!c.FaultBelow(node))
                {
                    // In phase: what the node passes on is what comes in; a leaf passes on nothing.
                    c.AssertClose(c.OutflowOf(node), towardSource, $"node {c.Grid.Nodes[node].Id}: reading facing the source vs the sum facing away");
                }
                else if (c.Scheme == GroundingScheme.Isolated && c.ChildrenAreAllSegments(node))
                {
                    // Isolated: the reading toward the fault carries what every other edge at the node carries.
                    var towardFault = c.Tree.ChildEdges(node).Single(e => c.FaultBelowEdge(e.Index, e.Child));
                    var others = towardSource + c.Tree.ChildEdges(node).Where(e => e != towardFault).Sum(e => c.Reading(e.Index, node));
                    c.AssertClose(others, c.Reading(towardFault.Index, node), $"node {c.Grid.Nodes[node].Id}: reading toward the fault vs the others");
                }
            }
        }, iter: 150);
    }

    [Fact]
    public void Readings_at_the_two_ends_of_a_segment_differ_by_its_own_charging_current()
    {
        Draws.Sample(draw =>
        {
            var c = Compute(draw);
            foreach (var s in Enumerable.Range(0, c.Grid.Segments.Length).Where(s => c.Tree.SubstationOf(c.Tree.SuppliedEndOf(s)) == c.Substation))
            {
                var up = c.Reading(s, c.Tree.SuppliedEndOf(s));
                var down = c.Reading(s, c.Tree.FarEndOf(s));
                var own = c.ChargingA(c.Tree.SegmentCapacitanceF(s));
                var id = c.Grid.Segments[s].Id;
                if (s == c.FaultSegment)
                {
                    if (c.Scheme == GroundingScheme.Isolated)
                    {
                        // Both ends feed the fault from the rest of the network: together its charging current less the segment's own.
                        c.AssertClose(c.ChargingA(c.Tree.TotalCapacitanceF(c.Substation)) - own, up + down, $"faulted {id}");
                    }
                }
                else if (!c.FaultBelow(c.Tree.FarEndOf(s)))
                {
                    c.AssertClose(own, up - down, $"healthy {id}");
                }
                else if (c.Scheme == GroundingScheme.Isolated)
                {
                    c.AssertClose(own, down - up, $"{id} on the path to the fault");
                }
            }
        }, iter: 150);
    }

    [Fact]
    public void Every_reading_matches_the_model_formula_and_the_sinks_of_the_network_sum_to_zero()
    {
        Draws.Sample(draw =>
        {
            var c = Compute(draw);
            var substation = c.Grid.Substations[c.Substation];
            var omega = c.Grid.AngularFrequencyRadPerS;
            var totalF = c.Tree.TotalCapacitanceF(c.Substation);
            var yd = new Complex(substation.Grounding.DampingPercent / 100 * omega, omega);
            var yn = NeutralAdmittance.OfNeutral(substation, totalF, omega);
            var solution = FaultCurrents.Model(c.Network).Solve(c.FaultSegment, draw.Position, draw.Type, draw.FaultResistanceOhm);
            var u0 = solution.Currents.NeutralVoltageAtBusV;
            var fault = solution.Currents.EarthCurrentA;

            // Global balance: the fault current returns through every shunt of the network and the neutral.
            var sinks = fault + (3 * ((yd * totalF) + yn) * u0);
            Assert.True(sinks.Magnitude <= RelativeTolerance * fault.Magnitude + 1e-12, $"sinks sum to {sinks.Magnitude} A, fault {fault.Magnitude} A");
            c.AssertClose(fault.Magnitude, c.Result.FaultCurrentA, "fault current");
            Assert.Equal(u0.Magnitude, c.Result.NeutralVoltageV, (RelativeTolerance * u0.Magnitude) + 1e-9);

            foreach (var response in c.Result.Indicators)
            {
                var indicator = c.Grid.Indicator(response.Id);
                var s = c.Grid.SegmentIndex(indicator.Segment);
                var node = c.Grid.NodeIndex(indicator.Node);
                if (c.Tree.SubstationOf(node) != c.Substation)
                {
                    Assert.Equal(0, response.ResidualCurrentA);
                    continue;
                }

                var far = c.Tree.FarEndOf(s);
                var away = c.Tree.SuppliedEndOf(s) == node;
                var faultBeyondFar = c.FaultBelow(far);
                var inRegion = s == c.FaultSegment || (away ? faultBeyondFar : !faultBeyondFar);
                var regionF = away ? c.Tree.SegmentCapacitanceF(s) + c.Tree.CapacitanceBeyondF(far) : totalF - c.Tree.CapacitanceBeyondF(far);
                var regionS = (yd * regionF) + (away ? Complex.Zero : yn);
                var expected = (3 * regionS * u0) + (inRegion ? fault : Complex.Zero);

                Assert.Equal(inRegion, response.FaultBeyond);
                c.AssertClose(expected.Magnitude, response.ResidualCurrentA, $"{response.Id}");
            }
        }, iter: 150);
    }

    [Fact]
    public void Earth_fault_current_never_increases_with_fault_resistance()
    {
        var gen = Gen.Select(Gen.Int[5, 80], Gen.Int, Gen.Enum<GroundingScheme>(), Gen.Double[0, 1], Gen.Double[0, 1], Gen.Double[0, 5000], Gen.Double[0, 5000]);
        gen.Sample((segments, seed, scheme, pick, position, rfA, rfB) =>
        {
            var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed, scheme));
            var model = FaultCurrents.Model(Grids.Normal(grid));
            var segment = Math.Min((int)(pick * grid.Segments.Length), grid.Segments.Length - 1);
            var (low, high) = (Math.Min(rfA, rfB), Math.Max(rfA, rfB));

            var iLow = SequenceFault.FaultCurrentA(FaultType.LG, model.Solve(segment, position, FaultType.LG, low).Currents);
            var iHigh = SequenceFault.FaultCurrentA(FaultType.LG, model.Solve(segment, position, FaultType.LG, high).Currents);

            // |I_f| = 3E/|Z + 3Rf| with Re(Z) > 0 in every scheme, so more Rf never draws more current.
            Assert.True(iHigh <= iLow * (1 + 1e-12), $"{scheme}: {iHigh} A at {high} Ω exceeds {iLow} A at {low} Ω");
            if (high > low + 1)
            {
                Assert.True(iHigh < iLow, $"{scheme}: no drop from {low} Ω to {high} Ω");
            }
        }, iter: 200);
    }

    private static Computed Compute(EarthFaultDraw draw)
    {
        var generated = SyntheticGrid.Generate(draw.Options);
        var farEnd = generated.Segments.Select(s => new Indicator(new IndicatorId($"FAR-{s.Id}"), s.Id, s.To, null, 1, false, true));
        var grid = Grid.Create(generated.Name, generated.FrequencyHz, generated.LineTypes, generated.Substations, generated.Nodes,
            generated.Segments, generated.Switches, generated.Indicators.Concat(farEnd));
        var network = Grids.Normal(grid);
        var tree = RadialTree.Normal(grid);
        var faultSegment = Math.Min((int)(draw.FaultPick * grid.Segments.Length), grid.Segments.Length - 1);
        var result = FaultCurrents.At(network, new FaultCase(grid.Segments[faultSegment].Id, draw.Position, draw.Type, draw.FaultResistanceOhm));
        return new Computed(grid, network, tree, faultSegment, result);
    }

    public sealed record EarthFaultDraw(SyntheticGridOptions Options, double FaultPick, double Position, double FaultResistanceOhm, FaultType Type);

    private sealed class Computed
    {
        private readonly Dictionary<(int Segment, int Node), double> _readings = [];

        public Computed(Grid grid, EnergisedNetwork network, RadialTree tree, int faultSegment, FaultResult result)
        {
            Grid = grid;
            Network = network;
            Tree = tree;
            FaultSegment = faultSegment;
            Result = result;
            Substation = tree.SubstationOf(tree.SuppliedEndOf(faultSegment));
            Scheme = grid.Substations[Substation].Grounding.Scheme;
            ParentSegment = Enumerable.Repeat(-1, grid.Nodes.Length).ToArray();
            for (var s = 0; s < grid.Segments.Length; s++)
            {
                if (tree.FarEndOf(s) >= 0)
                {
                    ParentSegment[tree.FarEndOf(s)] = s;
                }
            }

            foreach (var r in result.Indicators)
            {
                var i = grid.Indicator(r.Id);
                _readings.Add((grid.SegmentIndex(i.Segment), grid.NodeIndex(i.Node)), r.ResidualCurrentA);
            }

            Assert.Equal(2 * grid.Segments.Length, _readings.Count);
            Scale = result.FaultCurrentA + result.Indicators.Max(i => i.ResidualCurrentA);
        }

        public Grid Grid { get; }

        public EnergisedNetwork Network { get; }

        public RadialTree Tree { get; }

        public int FaultSegment { get; }

        public FaultResult Result { get; }

        public int Substation { get; }

        public GroundingScheme Scheme { get; }

        /// <summary>Per node, the segment feeding it, or -1 (a bus, or fed through a switch).</summary>
        public int[] ParentSegment { get; }

        private double Scale { get; }

        public double Reading(int segment, int node) => _readings[(segment, node)];

        /// <summary>True when the faulted segment hangs at or below <paramref name="node"/> (the fault lies beyond it).</summary>
        public bool FaultBelow(int node) => Tree.IsAtOrBeyond(node, Tree.SuppliedEndOf(FaultSegment));

        public bool FaultBelowEdge(int segment, int child) => segment == FaultSegment || FaultBelow(child);

        public bool ChildrenAreAllSegments(int node) => Tree.ChildEdges(node).All(e => e.IsSegment);

        /// <summary>Magnitudes read facing away at the node, summed; through a closed switch, what its far node passes on.</summary>
        public double OutflowOf(int node) => Tree.ChildEdges(node).Sum(e => e.IsSegment ? Reading(e.Index, node) : OutflowOf(e.Child));

        /// <summary>3·|(jω + dω)·C|·|U0|: the charging current of capacitance C at the model's neutral displacement, A.</summary>
        public double ChargingA(double capacitanceF)
        {
            var d = Grid.Substations[Substation].Grounding.DampingPercent / 100;
            return 3 * Grid.AngularFrequencyRadPerS * capacitanceF * Math.Sqrt(1 + (d * d)) * Result.NeutralVoltageV;
        }

        public void AssertClose(double expected, double actual, string what) =>
            Assert.True(Math.Abs(expected - actual) <= (RelativeTolerance * Scale) + 1e-12,
                $"{what}: expected {expected} A, got {actual} A ({Scheme}, fault on {Grid.Segments[FaultSegment].Id})");
    }
}
