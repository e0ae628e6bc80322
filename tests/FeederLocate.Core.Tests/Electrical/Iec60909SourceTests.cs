using System.Numerics;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.ReferenceCases;

namespace FeederLocate.Core.Tests.Electrical;

public class Iec60909SourceTests
{
    private static readonly double PhaseVoltage20kVV = Iec60909Substation20kV.VoltageFactor * 20_000 / Math.Sqrt(3);

    [Fact]
    public void Voltage_factors_for_medium_voltage_are_those_of_IEC_60909_0_table_1()
    {
        // IEC 60909-0 Table 1, 1 kV < Un ≤ 35 kV: cmax 1.10, cmin 1.00.
        Assert.Equal(1.10, SourceImpedance.VoltageFactorMaxMediumVoltage, 12);
        Assert.Equal(1.00, SourceImpedance.VoltageFactorMinMediumVoltage, 12);

        // FORMATS.md: --voltage-factor defaults to cmax.
        Assert.Equal(1.10, new FaultCase(new SegmentId("S1"), 0.5, FaultType.LG).VoltageFactor, 12);
    }

    [Fact]
    public void Network_feeder_without_known_R_over_X_has_XQ_of_0_995_ZQ()
    {
        // IEC 60909-0, network feeders (CHECK-VALUES.md): with R/X unknown, RQ = 0.1·XQ and XQ = 0.995·ZQ.
        var z = SourceImpedance.NetworkFeederOhm(1.1, 20, 250, 0.1);

        Assert.Equal(0.995, z.Imaginary / z.Magnitude, 0.0001);
        Assert.Equal(0.1, z.Real / z.Imaginary, 1e-12);
        Assert.Equal(1.1 * 20 * 20 / 250, z.Magnitude, 1e-12);
    }

    [Fact]
    public void Network_feeder_referred_to_6_kV_matches_IEC_TR_60909_4_example()
    {
        var zQ = SourceImpedance.NetworkFeederOhm(
            IecTr60909Part4MediumVoltageExample.VoltageFactor,
            IecTr60909Part4MediumVoltageExample.FeederNominalVoltageKv,
            IecTr60909Part4MediumVoltageExample.FeederShortCircuitMva,
            IecTr60909Part4MediumVoltageExample.FeederROverX);
        var tr = IecTr60909Part4MediumVoltageExample.TransformationRatio;
        var zQt = zQ / (tr * tr);

        // IEC TR 60909-4 (33 kV / 6 kV example): ZQt = 0.0058 + j0.0579 Ω, tolerance 0.00006 Ω.
        AssertImpedance(IecTr60909Part4MediumVoltageExample.FeederReferredOhm, zQt,
            IecTr60909Part4MediumVoltageExample.ImpedanceToleranceOhm, IecTr60909Part4MediumVoltageExample.ImpedanceToleranceOhm);
    }

    [Fact]
    public void Transformer_correction_matches_IEC_TR_60909_4_example()
    {
        var t = IecTr60909Part4MediumVoltageExample.Transformer;

        // IEC TR 60909-4 (33 kV / 6 kV example): KT = 0.95878 (±0.00001), ZTK = 0.0152 + j0.3803 Ω.
        Assert.Equal(IecTr60909Part4MediumVoltageExample.CorrectionFactor, SourceImpedance.TransformerCorrectionFactor(t),
            IecTr60909Part4MediumVoltageExample.CorrectionFactorTolerance);
        AssertImpedance(IecTr60909Part4MediumVoltageExample.CorrectedTransformerOhm, SourceImpedance.CorrectedTransformerOhm(t),
            IecTr60909Part4MediumVoltageExample.ImpedanceToleranceOhm,
            IecTr60909Part4MediumVoltageExample.TransformerReactanceToleranceOhm);
    }

    [Fact]
    public void Upstream_network_and_transformer_give_the_derived_20_kV_busbar_impedance()
    {
        var substation = Iec60909Substation20kV.Substation(new Grounding(GroundingScheme.Isolated));

        // Derived from IEC 60909-0 (CHECK-VALUES.md): KT 0.97485, Zk = 0.05908 + j1.44990 Ω, ±0.00001 Ω.
        Assert.Equal(Iec60909Substation20kV.CorrectionFactor, SourceImpedance.TransformerCorrectionFactor(Iec60909Substation20kV.Transformer),
            Iec60909Substation20kV.CorrectionFactorTolerance);
        AssertImpedance(Iec60909Substation20kV.ShortCircuitOhm, SourceImpedance.AtBusbarOhm(substation, Iec60909Substation20kV.VoltageFactor),
            Iec60909Substation20kV.ImpedanceToleranceOhm, Iec60909Substation20kV.ImpedanceToleranceOhm);
    }

    [Fact]
    public void Three_and_two_phase_currents_at_the_20_kV_busbar_match_the_derived_values()
    {
        var zk = SourceImpedance.AtBusbarOhm(Iec60909Substation20kV.Substation(new Grounding(GroundingScheme.Isolated)), 1.1);

        var lll = SequenceFault.Solve(FaultType.LLL, PhaseVoltage20kVV, zk, Complex.Zero, Complex.Zero, 0);
        var ll = SequenceFault.Solve(FaultType.LL, PhaseVoltage20kVV, zk, Complex.Zero, Complex.Zero, 0);

        // Derived from IEC 60909-0 (CHECK-VALUES.md): I"k3 8.753 kA, I"k2 7.580 kA, ±0.6 A.
        Assert.Equal(Iec60909Substation20kV.ThreePhaseCurrentA, SequenceFault.FaultCurrentA(FaultType.LLL, lll), Iec60909Substation20kV.CurrentToleranceA);
        Assert.Equal(Iec60909Substation20kV.TwoPhaseCurrentA, SequenceFault.FaultCurrentA(FaultType.LL, ll), Iec60909Substation20kV.CurrentToleranceA);
    }

    [Fact]
    public void Three_phase_current_after_5_km_of_cable_matches_the_derived_value()
    {
        var zk = SourceImpedance.AtBusbarOhm(Iec60909Substation20kV.Substation(new Grounding(GroundingScheme.Isolated)), 1.1);
        var cable = new Complex(Iec60909Substation20kV.CableR1OhmPerKm, Iec60909Substation20kV.CableX1OhmPerKm) * Iec60909Substation20kV.CableLengthKm;

        var lll = SequenceFault.Solve(FaultType.LLL, PhaseVoltage20kVV, zk + cable, Complex.Zero, Complex.Zero, 0);

        // Derived from IEC 60909-0 (CHECK-VALUES.md): I"k3 5.514 kA, ±0.6 A.
        Assert.Equal(Iec60909Substation20kV.ThreePhaseCurrentAtCableEndA, SequenceFault.FaultCurrentA(FaultType.LLL, lll), Iec60909Substation20kV.CurrentToleranceA);
    }

    [Fact]
    public void Single_phase_current_through_an_11_547_ohm_neutral_resistor_matches_the_derived_value()
    {
        var zk = SourceImpedance.AtBusbarOhm(Iec60909Substation20kV.Substation(new Grounding(GroundingScheme.Isolated)), 1.1);
        var ztk = SourceImpedance.CorrectedTransformerOhm(Iec60909Substation20kV.Transformer);

        // Z0 = 3·RN + ZTK: the zero-sequence shunt at the bus is its reciprocal; no capacitance.
        var lg = SequenceFault.Solve(FaultType.LG, PhaseVoltage20kVV, zk, Complex.Zero,
            1 / (ztk + (3 * Iec60909Substation20kV.NeutralResistanceOhm)), 0);

        // Derived from IEC 60909-0 (CHECK-VALUES.md): I"k1 ≈ 1087 A, ±0.6 A.
        Assert.Equal(Iec60909Substation20kV.SinglePhaseCurrentA, SequenceFault.FaultCurrentA(FaultType.LG, lg), Iec60909Substation20kV.SinglePhaseToleranceA);
    }

    [Fact]
    public void Grid_with_upstream_network_and_transformer_gives_the_busbar_currents_at_the_feeder_head()
    {
        var grid = GridReader.Parse(Iec60909Substation20kV.GridJson(Iec60909Substation20kV.CableLengthKm)).ValueOrThrow();

        var lll = FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 0, FaultType.LLL));
        var ll = FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 0, FaultType.LL));
        var end = FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 1, FaultType.LLL));

        // Derived from IEC 60909-0 (CHECK-VALUES.md): 8.753 kA and 7.580 kA at the bus, 5.514 kA after 5 km; ±0.6 A.
        Assert.Equal(Iec60909Substation20kV.ThreePhaseCurrentA, lll.FaultCurrentA, Iec60909Substation20kV.CurrentToleranceA);
        Assert.Equal(Iec60909Substation20kV.TwoPhaseCurrentA, ll.FaultCurrentA, Iec60909Substation20kV.CurrentToleranceA);
        Assert.Equal(Iec60909Substation20kV.ThreePhaseCurrentAtCableEndA, end.FaultCurrentA, Iec60909Substation20kV.CurrentToleranceA);
        Assert.Equal(lll.FaultCurrentA, lll.Indicators.Single().PhaseCurrentA, 1e-9);
    }

    [Fact]
    public void Fault_on_a_10_m_cable_is_within_0_1_percent_of_the_busbar_current()
    {
        var grid = GridReader.Parse(Iec60909Substation20kV.GridJson(0.01)).ValueOrThrow();

        var lll = FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 0.5, FaultType.LLL));

        // Derived from IEC 60909-0 (CHECK-VALUES.md): 8753 A at the bus; 5 m of cable take off about 2 A.
        Assert.InRange(lll.FaultCurrentA, Iec60909Substation20kV.ThreePhaseCurrentA * 0.999,
            Iec60909Substation20kV.ThreePhaseCurrentA + Iec60909Substation20kV.CurrentToleranceA);
    }

    [Fact]
    public void Grid_with_neutral_resistor_gives_the_derived_single_phase_current_at_the_feeder_head()
    {
        var grid = GridReader.Parse(Iec60909Substation20kV.GridJson(
            Iec60909Substation20kV.CableLengthKm, """{ "scheme": "impedance", "neutralResistanceOhm": 11.547 }""")).ValueOrThrow();

        var lg = FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 0, FaultType.LG));

        // Derived from IEC 60909-0 (CHECK-VALUES.md): I"k1 ≈ 1087 A with Z0TK = KT·Z0T = ZTK (§6.3.3); ±0.6 A.
        Assert.Equal(Iec60909Substation20kV.SinglePhaseCurrentA, lg.FaultCurrentA, Iec60909Substation20kV.SinglePhaseToleranceA);
    }

    [Fact]
    public void The_transformer_zero_sequence_impedance_is_corrected_by_KT_only_where_the_transformer_is_given()
    {
        // IEC 60909-0 §6.3.3: Z0TK = KT·Z0T with the same KT (0.97485, CHECK-VALUES.md) as the positive sequence;
        // a substation given by S"k alone keeps transformerZ0Ohm as given.
        var given = new ImpedanceOhm(0.0441, 1.322265);
        var viaTransformer = Iec60909Substation20kV.Substation(new Grounding(GroundingScheme.Solid), given);
        var busbarOnly = viaTransformer with { Supply = new BusbarShortCircuit(300, 0.1) };

        var corrected = SourceImpedance.TransformerZeroSequenceOhm(viaTransformer);

        Assert.Equal(0.97485, SourceImpedance.TransformerCorrectionFactor(Iec60909Substation20kV.Transformer), 5);
        // ±2e-5 Ω: the values are transcribed to six decimals.
        Assert.Equal(Iec60909Substation20kV.CorrectedTransformerOhm.Real, corrected.Real, 2e-5);
        Assert.Equal(Iec60909Substation20kV.CorrectedTransformerOhm.Imaginary, corrected.Imaginary, 2e-5);
        Assert.Equal(new System.Numerics.Complex(0.0441, 1.322265), SourceImpedance.TransformerZeroSequenceOhm(busbarOnly));
    }

    [Fact]
    public void Hand_worked_feeder_gives_three_two_and_single_phase_currents_at_the_cable_end()
    {
        var grid = GridReader.Parse(HandWorkedMvFeeder.GridJson).ValueOrThrow();
        FaultResult At(FaultType type) => FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 1, type));

        var lll = At(FaultType.LLL);
        var ll = At(FaultType.LL);
        var lg = At(FaultType.LG);

        // Hand-worked from IEC 60909-0 and the symmetrical-component connections (HandWorkedMvFeeder), ±0.2 A.
        Assert.Equal(HandWorkedMvFeeder.ThreePhaseCurrentA, lll.FaultCurrentA, HandWorkedMvFeeder.ToleranceA);
        Assert.Equal(HandWorkedMvFeeder.TwoPhaseCurrentA, ll.FaultCurrentA, HandWorkedMvFeeder.ToleranceA);
        Assert.Equal(HandWorkedMvFeeder.SinglePhaseCurrentA, lg.FaultCurrentA, HandWorkedMvFeeder.ToleranceA);

        // With Z2 = Z1 the two-phase current is √3/2 of the three-phase one, exactly.
        Assert.Equal(Math.Sqrt(3) / 2 * lll.FaultCurrentA, ll.FaultCurrentA, 1e-6);
    }

    [Fact]
    public void Hand_worked_feeder_gives_the_two_phase_to_earth_current_to_earth()
    {
        var grid = GridReader.Parse(HandWorkedMvFeeder.GridJson).ValueOrThrow();

        var llg = FaultCurrents.At(grid, new FaultCase(new SegmentId("S1"), 1, FaultType.LLG));

        // Hand-worked: |3I0| = 3E/|Z1F + 2·Z0F| (symmetrical components, Z2 = Z1), ±0.2 A.
        Assert.Equal(HandWorkedMvFeeder.TwoPhaseToEarthEarthCurrentA, llg.FaultCurrentA, HandWorkedMvFeeder.ToleranceA);
    }

    private static void AssertImpedance(Complex expected, Complex actual, double resistanceToleranceOhm, double reactanceToleranceOhm)
    {
        Assert.True(Math.Abs(expected.Real - actual.Real) <= resistanceToleranceOhm,
            $"R: expected {expected.Real} ± {resistanceToleranceOhm} Ω, got {actual.Real}");
        Assert.True(Math.Abs(expected.Imaginary - actual.Imaginary) <= reactanceToleranceOhm,
            $"X: expected {expected.Imaginary} ± {reactanceToleranceOhm} Ω, got {actual.Imaginary}");
    }
}
