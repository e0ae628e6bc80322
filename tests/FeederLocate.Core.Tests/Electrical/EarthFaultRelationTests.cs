using System.Numerics;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.ReferenceCases;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Electrical;

public class EarthFaultRelationTests
{
    private const double Omega50HzRadPerS = 2 * Math.PI * 50;

    /// <summary>E = c·Un/√3 at 20 kV with the default c = 1.1.</summary>
    private static readonly double PhaseVoltageV = 1.1 * 20_000 / Math.Sqrt(3);

    private static readonly Substation IsolatedBus = new(
        new SubstationId("SUB"), new NodeId("BUS"), 20, new BusbarShortCircuit(250, 0.1), null, null, new Grounding(GroundingScheme.Isolated));

    // ---- isolated neutral ----

    [Fact]
    public void Bolted_earth_fault_on_a_short_isolated_cable_draws_three_omega_C0_E_and_lifts_healthy_phases_to_root_3_E()
    {
        // 2 km of 250 nF/km: 1/(ωC0) = 6366 Ω against a series impedance 2·Z1F + Z0path of about 5 Ω.
        var grid = SmallGrids.SingleCable("""{ "scheme": "isolated" }""", 2, 250);
        var capacitanceF = 2 * 250e-9;

        var result = FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 1, FaultType.LG));

        // Common practice (fact of the trade): |I_f| = 3ωC0·E = 5.99 A; the series impedance moves it by
        // under 0.1 %, so ±0.2 %. Healthy phases at √3·E = 22.0 kV, ±1 %.
        var chargingA = 3 * Omega50HzRadPerS * capacitanceF * PhaseVoltageV;
        Assert.InRange(result.FaultCurrentA, chargingA * 0.998, chargingA * 1.002);
        Assert.Equal(2, result.HealthyPhaseVoltagesV.Length);
        Assert.All(result.HealthyPhaseVoltagesV, u => Assert.InRange(u, Math.Sqrt(3) * PhaseVoltageV * 0.99, Math.Sqrt(3) * PhaseVoltageV * 1.01));

        // The neutral is displaced by about E.
        Assert.InRange(result.NeutralVoltageV, PhaseVoltageV * 0.99, PhaseVoltageV * 1.01);
    }

    [Fact]
    public void Charging_current_of_100_A_at_20_kV_means_9_189_microfarad_per_phase()
    {
        var capacitanceF = SymmetricalComponentEarthFaults.ChargingCurrentA / (3 * Omega50HzRadPerS * SymmetricalComponentEarthFaults.PhaseVoltageV);

        // Derived from the symmetrical-component relations (CHECK-VALUES.md): C0 = 9.189 µF, ±0.0005 µF.
        Assert.Equal(SymmetricalComponentEarthFaults.CapacitanceMicrofarad, capacitanceF * 1e6, SymmetricalComponentEarthFaults.CapacitanceToleranceMicrofarad);

        // And the engine's shunt for it is jωC0: |Y0|·3E gives back I_C.
        var y0 = NeutralAdmittance.AtBus(IsolatedBus, capacitanceF, Omega50HzRadPerS);
        Assert.Equal(0, y0.Real, 1e-15);
        Assert.Equal(SymmetricalComponentEarthFaults.ChargingCurrentA, 3 * y0.Imaginary * SymmetricalComponentEarthFaults.PhaseVoltageV, 1e-9);
    }

    [Theory]
    [MemberData(nameof(SymmetricalComponentEarthFaults.Isolated), MemberType = typeof(SymmetricalComponentEarthFaults))]
    public void Isolated_network_earth_fault_through_resistance_matches_the_derived_voltage_and_current(
        double faultResistanceOhm, double neutralVoltageRatio, double faultCurrentA, double currentToleranceA)
    {
        var e = SymmetricalComponentEarthFaults.PhaseVoltageV;
        var capacitanceF = SymmetricalComponentEarthFaults.ChargingCurrentA / (3 * Omega50HzRadPerS * e);
        var y0 = NeutralAdmittance.AtBus(IsolatedBus, capacitanceF, Omega50HzRadPerS);

        // Series impedance neglected (Z1 = 0, Z0path = 0), as in the derivation.
        var currents = SequenceFault.Solve(FaultType.LG, e, Complex.Zero, Complex.Zero, y0, faultResistanceOhm);

        // Derived from the symmetrical-component relations (CHECK-VALUES.md): |U0/E| ±0.00005, I_F to its last digit.
        Assert.Equal(neutralVoltageRatio, currents.NeutralVoltageAtBusV.Magnitude / e, SymmetricalComponentEarthFaults.VoltageRatioTolerance);
        Assert.Equal(faultCurrentA, SequenceFault.FaultCurrentA(FaultType.LG, currents), currentToleranceA);
    }

    // ---- resonant ----

    [Theory]
    [MemberData(nameof(SymmetricalComponentEarthFaults.Resonant), MemberType = typeof(SymmetricalComponentEarthFaults))]
    public void Resonant_network_leaves_the_derived_residual_and_neutral_displacement(
        double detuningPercent, double residualA, double neutralVoltageRatioAt1000Ohm)
    {
        var e = SymmetricalComponentEarthFaults.PhaseVoltageV;
        var capacitanceF = SymmetricalComponentEarthFaults.ChargingCurrentA / (3 * Omega50HzRadPerS * e);
        var substation = IsolatedBus with
        {
            Grounding = new Grounding(GroundingScheme.Resonant, detuningPercent, SymmetricalComponentEarthFaults.ResonantDampingPercent),
        };
        var y0 = NeutralAdmittance.AtBus(substation, capacitanceF, Omega50HzRadPerS);

        var bolted = SequenceFault.Solve(FaultType.LG, e, Complex.Zero, Complex.Zero, y0, 0);
        var resistive = SequenceFault.Solve(FaultType.LG, e, Complex.Zero, Complex.Zero, y0, 1000);

        // Derived (CHECK-VALUES.md): I_C·√(d² + v²) = 5.000 A (v 0), 11.18 A (v ±10 %); |U0/E| at 1000 Ω ±0.00005.
        Assert.Equal(residualA, SequenceFault.FaultCurrentA(FaultType.LG, bolted), SymmetricalComponentEarthFaults.ResonantResidualToleranceA);
        Assert.Equal(neutralVoltageRatioAt1000Ohm, resistive.NeutralVoltageAtBusV.Magnitude / e, SymmetricalComponentEarthFaults.VoltageRatioTolerance);
    }

    [Fact]
    public void Tuned_coil_leaves_only_the_damping_share_of_the_charging_current()
    {
        var json = RepositoryFiles.Read("tests", "FeederLocate.Core.Tests", "ReferenceCases", "TinyFen", "tiny-resonant.grid.json")
            .Replace("\"detuningPercent\": 5", "\"detuningPercent\": 0", StringComparison.Ordinal);
        var grid = GridReader.Parse(json).ValueOrThrow();
        Assert.Equal(0, grid.Substations[0].Grounding.DetuningPercent);
        var d = grid.Substations[0].Grounding.DampingPercent / 100;
        var capacitanceF = RadialTree.Normal(grid).TotalCapacitanceF(0);
        var chargingA = 3 * grid.AngularFrequencyRadPerS * capacitanceF * PhaseVoltageV;

        var result = FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 0, FaultType.LG));

        // Common practice (fact of the trade): a tuned coil (v = 0) leaves d·I_C = 0.03·21.3 A = 0.64 A.
        // The series impedance (a few Ω) against 1/(d·ωC0) ≈ 60 kΩ moves it by under 0.01 %: ±0.1 %.
        Assert.InRange(result.FaultCurrentA, d * chargingA * 0.999, d * chargingA * 1.001);
    }

    // ---- impedance (resistor) ----

    [Theory]
    [MemberData(nameof(SymmetricalComponentEarthFaults.NeutralResistorLimits), MemberType = typeof(SymmetricalComponentEarthFaults))]
    public void Neutral_resistor_limits_the_earth_fault_current_to_E_over_RN(double neutralResistanceOhm, double limitA)
    {
        var e = 20_000 / Math.Sqrt(3);

        // Stiff source, bolted fault at the bus: only the resistor limits the current.
        var currents = SequenceFault.Solve(FaultType.LG, e, Complex.Zero, Complex.Zero, 1 / new Complex(3 * neutralResistanceOhm, 0), 0);

        // Derived (CHECK-VALUES.md): 20 kV/1000 A → 11.547 Ω, 20 kV/300 A → 38.49 Ω; the resistances are
        // given to five significant digits, so ±0.005 %.
        Assert.Equal(limitA, SequenceFault.FaultCurrentA(FaultType.LG, currents), limitA * 0.00005);
    }

    [Fact]
    public void Twelve_ohm_neutral_resistor_of_the_sample_grid_gives_roughly_1000_A_at_the_feeder_head()
    {
        var grid = Grids.Sample("impedance");
        Assert.All(grid.Substations, s => Assert.Equal(12, s.Grounding.NeutralResistanceOhm));

        var a = FaultCurrents.At(grid, new FaultCase(new SegmentId("S101"), 0, FaultType.LG));
        var b = FaultCurrents.At(grid, new FaultCase(new SegmentId("S401"), 0, FaultType.LG));

        // Common practice: low-impedance grounding limits earth-fault current to hundreds of A up to about
        // 1000 A (IEEE Std 142, from memory). E/RN = 12.7 kV/12 Ω = 1058 A less the series impedance: ±10 % of 1000 A.
        Assert.InRange(a.FaultCurrentA, 900, 1100);
        Assert.InRange(b.FaultCurrentA, 900, 1100);
    }

    // ---- solid: IEC 60071-1 earth-fault factor ----

    [Theory]
    [MemberData(nameof(SymmetricalComponentEarthFaults.EarthFaultFactor), MemberType = typeof(SymmetricalComponentEarthFaults))]
    public void Earth_fault_factor_matches_the_derived_table(double x0OverX1, double r0OverX1, double ubOverE, double ucOverE)
    {
        var (ub, uc) = HealthyPhasesPerUnit(x0OverX1, r0OverX1);

        // Derived from the symmetrical-component relations for IEC 60071-1's earth-fault factor (CHECK-VALUES.md), ±0.0005.
        Assert.Equal(ubOverE, ub, SymmetricalComponentEarthFaults.EarthFaultFactorTolerance);
        Assert.Equal(ucOverE, uc, SymmetricalComponentEarthFaults.EarthFaultFactorTolerance);
    }

    [Fact]
    public void Network_with_X0_over_X1_up_to_3_and_R0_over_X1_up_to_1_is_effectively_earthed()
    {
        // IEC 60071-1: effectively earthed means an earth-fault factor ≤ 1.4, obtained approximately when
        // X0/X1 < 3 and R0/X1 < 1. The approximation holds for X0 ≥ X1 (zero-sequence reactance at least the
        // positive-sequence one, as on MV feeders); see the next test for where it fails.
        var worst = 0.0;
        for (var x = 1.0; x <= 3.0 + 1e-9; x += 0.05)
        {
            for (var r = 0.0; r <= 1.0 + 1e-9; r += 0.05)
            {
                var (ub, uc) = HealthyPhasesPerUnit(x, r);
                worst = Math.Max(worst, Math.Max(ub, uc));
            }
        }

        Assert.InRange(worst, 1.0, 1.4);

        // The corner X0/X1 = 3, R0/X1 = 1 is the worst point of the region: 1.347 (derived, CHECK-VALUES.md).
        Assert.Equal(1.347, worst, SymmetricalComponentEarthFaults.EarthFaultFactorTolerance);
    }

    [Fact]
    public void Earth_fault_factor_rule_of_thumb_fails_for_a_resistive_zero_sequence_with_hardly_any_reactance()
    {
        var (_, uc) = HealthyPhasesPerUnit(0, 1);

        // Derived from the symmetrical-component relations: Z0 = X1 (resistive), Z1 = jX1 gives 1.496 > 1.4,
        // which is why the IEC 60071-1 condition is stated as approximate.
        Assert.Equal(1.496, uc, SymmetricalComponentEarthFaults.EarthFaultFactorTolerance);
    }

    [Fact]
    public void Solidly_grounded_sample_grid_keeps_healthy_phases_at_or_below_1_4_E_where_the_IEC_60071_1_condition_holds()
    {
        var grid = Grids.Sample("solid");
        var model = FaultCurrents.Model(Grids.Normal(grid));
        var checkedPoints = 0;
        for (var s = 0; s < grid.Segments.Length; s++)
        {
            foreach (var position in new[] { 0.0, 0.5, 1.0 })
            {
                var solution = model.Solve(s, position, FaultType.LG, 0);
                var y0 = NeutralAdmittance.AtBus(grid.Substations[solution.Substation], model.Aggregates.TotalCapacitanceF(solution.Substation), grid.AngularFrequencyRadPerS);
                var z0 = solution.ZeroSequencePathOhm + (1 / y0);
                var x1 = solution.PositiveSequenceOhm.Imaginary;
                if (z0.Imaginary / x1 > 3 || z0.Real / x1 > 1 || z0.Imaginary < x1)
                {
                    continue;
                }

                checkedPoints++;
                var result = FaultCurrents.At(grid, new FaultCase(grid.Segments[s].Id, position, FaultType.LG));

                // IEC 60071-1: effectively earthed, earth-fault factor ≤ 1.4.
                Assert.All(result.HealthyPhaseVoltagesV, u => Assert.True(u <= 1.4 * solution.PhaseVoltageV, $"{grid.Segments[s].Id} at {position}: {u} V > 1.4·E"));
            }
        }

        Assert.True(checkedPoints >= 10, $"only {checkedPoints} fault points meet the condition");
    }

    // ---- distance ----

    [Theory]
    [InlineData("solid")]
    [InlineData("impedance")]
    public void Earth_fault_current_falls_with_distance_on_solid_and_impedance_grounding(string scheme)
    {
        var currents = AlongTheA1Trunk(scheme, FaultType.LG);

        // Common practice (fact of the trade): the faulted-phase current shrinks with distance.
        for (var i = 1; i < currents.Count; i++)
        {
            Assert.True(currents[i].CurrentA < currents[i - 1].CurrentA,
                $"{currents[i].Where}: {currents[i].CurrentA} A is not below {currents[i - 1].Where}: {currents[i - 1].CurrentA} A");
        }

        Assert.True(currents[^1].CurrentA < 0.9 * currents[0].CurrentA, "the trunk is long enough to matter");
    }

    [Fact]
    public void Earth_fault_current_hardly_changes_with_distance_on_an_isolated_network()
    {
        var currents = AlongTheA1Trunk("isolated", FaultType.LG);

        // Common practice (fact of the trade): the charging current of the whole network flows whatever the
        // distance; the series impedance (tens of Ω) against 1/(ωC0) ≈ 760 Ω shifts it by a few %: within 5 %.
        var first = currents[0].CurrentA;
        Assert.All(currents, c => Assert.InRange(c.CurrentA, first * 0.95, first * 1.05));
    }

    // ---- false indications ----

    [Fact]
    public void Non_directional_earth_indicator_on_a_healthy_cable_lateral_of_an_isolated_network_indicates_falsely()
    {
        // TinyFen: FI3 at the start of the 4 km cable lateral S3 (earth pickup 8 A); the fault is on S2.
        var grid = Grids.TinyFen("isolated");
        var result = FaultCurrents.At(grid, new FaultCase(new SegmentId("S2"), 0.5, FaultType.LG));
        var fi3 = result.Indicators.Single(i => i.Id == new IndicatorId("FI3"));

        AssertFalseIndicationByOwnChargingCurrent(grid, result, fi3, ["S3"]);
    }

    [Fact]
    public void Non_directional_earth_indicator_on_the_healthy_feeder_of_the_isolated_sample_grid_indicates_falsely()
    {
        // FPI-A1-04 (earth pickup 10 A) at the start of S103; the fault is on feeder A2 (S207), so A1 is healthy.
        var grid = Grids.Sample("isolated");
        var result = FaultCurrents.At(grid, new FaultCase(new SegmentId("S207"), 0.5, FaultType.LG));
        var indicator = result.Indicators.Single(i => i.Id == new IndicatorId("FPI-A1-04"));
        var tree = RadialTree.Normal(grid);
        var s103 = grid.SegmentIndex(new SegmentId("S103"));
        var beyond = grid.Segments.Select((s, i) => (s, i))
            .Where(p => tree.IsAtOrBeyond(tree.FarEndOf(s103), tree.FarEndOf(p.i)))
            .Select(p => p.s.Id.Value)
            .ToArray();
        Assert.Contains("S103", beyond);

        AssertFalseIndicationByOwnChargingCurrent(grid, result, indicator, beyond);
    }

    // ---- other fault types ----

    [Fact]
    public void Two_phase_to_earth_current_to_earth_lies_between_the_phase_to_phase_and_single_phase_values_when_Z0_exceeds_Z1()
    {
        var grid = GridReader.Parse(HandWorkedMvFeeder.GridJson).ValueOrThrow();
        FaultResult At(FaultType type) => FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 1, type));

        var lg = At(FaultType.LG);
        var llg = At(FaultType.LLG);
        var ll = At(FaultType.LL);

        // Derived from the symmetrical components (Z2 = Z1): |3I0| is 3E/|2Z1 + Z0| for LG, 3E/|Z1 + 2Z0| for
        // LLG and 0 for LL, so with |Z0F| > |Z1F| (here 4.05 Ω against 2.24 Ω) the LLG value lies in between.
        Assert.True(HandWorkedMvFeeder.ZeroSequenceAtEndOhm.Magnitude > HandWorkedMvFeeder.PositiveSequenceAtEndOhm.Magnitude);
        Assert.All(ll.Indicators, i => Assert.Equal(0, i.ResidualCurrentA));
        Assert.InRange(llg.FaultCurrentA, 0.1 * lg.FaultCurrentA, lg.FaultCurrentA * 0.999);
        Assert.Equal(llg.FaultCurrentA, llg.Indicators.Single().ResidualCurrentA, 1e-6);
        Assert.Single(llg.HealthyPhaseVoltagesV);
    }

    [Fact]
    public void Bolted_two_phase_to_earth_fault_on_an_isolated_network_draws_half_the_charging_current_and_lifts_the_healthy_phase_to_1_5_E()
    {
        var grid = SmallGrids.SingleCable("""{ "scheme": "isolated" }""", 2, 250);

        var lg = FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 1, FaultType.LG));
        var llg = FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 1, FaultType.LLG));

        // Derived from the symmetrical components with Z1 ≪ Z0: |3I0| = 3E/|Z1 + 2Z0| ≈ half of 3E/|Z0| (the
        // LG value); phases b and c at earth put U0 = E/2 and phase a at 1.5·E. ±0.5 % for the series impedance.
        Assert.InRange(llg.FaultCurrentA, 0.5 * lg.FaultCurrentA * 0.995, 0.5 * lg.FaultCurrentA * 1.005);
        var ua = Assert.Single(llg.HealthyPhaseVoltagesV);
        Assert.InRange(ua, 1.5 * PhaseVoltageV * 0.995, 1.5 * PhaseVoltageV * 1.005);
        Assert.InRange(llg.NeutralVoltageV, 0.5 * PhaseVoltageV * 0.995, 0.5 * PhaseVoltageV * 1.005);
    }

    [Theory]
    [InlineData("isolated", FaultType.LL)]
    [InlineData("isolated", FaultType.LLL)]
    [InlineData("resonant", FaultType.LL)]
    [InlineData("solid", FaultType.LL)]
    [InlineData("solid", FaultType.LLL)]
    [InlineData("impedance", FaultType.LLL)]
    public void Short_circuits_without_earth_have_no_residual_current_no_neutral_displacement_and_no_healthy_phases(string scheme, FaultType type)
    {
        var grid = Grids.Sample(scheme);
        foreach (var segment in new[] { "S101", "S109", "S207", "S310" })
        {
            var result = FaultCurrents.At(grid, new FaultCase(new SegmentId(segment), 0.5, type));

            // DOMAIN.md: LL and LLL have no zero-sequence part.
            Assert.True(result.FaultCurrentA > 100, $"{segment}: a short circuit drives a short-circuit current");
            Assert.Equal(0, result.NeutralVoltageV);
            Assert.Empty(result.HealthyPhaseVoltagesV);
            Assert.All(result.Indicators, i => Assert.Equal(0, i.ResidualCurrentA));
        }
    }

    /// <summary>
    /// Per unit healthy-phase voltages of a bolted earth fault with Z1 = jX1 (X1 = 1), Z0 = R0 + jX0,
    /// through the engine's sequence solution and Fortescue transform: U1 = E − Z1·I1, U2 = −Z1·I2, U0 = −Z0·I0.
    /// </summary>
    private static (double Ub, double Uc) HealthyPhasesPerUnit(double x0OverX1, double r0OverX1)
    {
        var z1 = new Complex(0, 1);
        var z0 = new Complex(r0OverX1, x0OverX1);
        var c = SequenceFault.Solve(FaultType.LG, 1, z1, Complex.Zero, 1 / z0, 0);
        var u1 = 1 - (z1 * c.PositiveA);
        var u2 = -z1 * c.NegativeA;
        var u0 = -z0 * c.ZeroA;
        var (_, b, cc) = SymmetricalComponents.ToPhases(u0, u1, u2);
        return (b.Magnitude, cc.Magnitude);
    }

    /// <summary>Fault currents at positions 0.25, 0.5, 0.75, 1 of each segment on the path from bus A to A1-16, in order.</summary>
    private static List<(string Where, double CurrentA)> AlongTheA1Trunk(string scheme, FaultType type)
    {
        var grid = Grids.Sample(scheme);
        var network = Grids.Normal(grid);
        var path = network.PathFromSource(new NodeId("A1-16")).Where(e => e.Kind == EdgeKind.Segment).ToList();
        Assert.True(path.Count >= 6, "the trunk to A1-16 has at least six segments");
        var currents = new List<(string, double)>();
        foreach (var edge in path)
        {
            var segment = grid.Segments[edge.Index];
            var fromIsSupplied = network.SuppliedEndOf(edge.Index) == grid.NodeIndex(segment.From);
            foreach (var fromSupply in new[] { 0.25, 0.5, 0.75, 1.0 })
            {
                var position = fromIsSupplied ? fromSupply : 1 - fromSupply;
                var result = FaultCurrents.At(network, new FaultCase(segment.Id, position, type));
                currents.Add(($"{segment.Id} at {position}", result.FaultCurrentA));
            }
        }

        return currents;
    }

    /// <summary>
    /// The indicator does not have the fault beyond it, yet reports fault: its residual is the charging
    /// current of its own forward side, 3·|(jω + dω)·C_B|·|U0|, and exceeds its pickup.
    /// </summary>
    private static void AssertFalseIndicationByOwnChargingCurrent(Grid grid, FaultResult result, IndicatorResponse response, string[] forwardSegments)
    {
        var indicator = grid.Indicator(response.Id);
        var d = grid.Substations.Single(s => s.Id == result.Substation).Grounding.DampingPercent / 100;
        var capacitanceF = forwardSegments.Sum(id =>
        {
            var s = grid.Segment(new SegmentId(id));
            return grid.LineTypeOf(s).C0NfPerKm * 1e-9 * s.LengthKm;
        });
        var ownChargingA = 3 * grid.AngularFrequencyRadPerS * capacitanceF * Math.Sqrt(1 + (d * d)) * result.NeutralVoltageV;

        Assert.False(indicator.Directional);
        Assert.False(response.FaultBeyond);
        Assert.Equal(IndicatorState.Fault, response.Expected);
        Assert.True(response.ResidualCurrentA >= indicator.EarthPickupA, "the charging current beyond it exceeds its pickup");

        // Common practice (fact of the trade): a healthy cable branch returns its own charging current; ±1 %.
        Assert.InRange(response.ResidualCurrentA, ownChargingA * 0.99, ownChargingA * 1.01);
    }
}
