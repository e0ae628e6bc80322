using System.Runtime.CompilerServices;
using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using Complex = System.Numerics.Complex;

namespace FeederLocate.Core.Electrical;

/// <summary>
/// The reference model compiled for one energised network and voltage factor: per substation its
/// source impedance and zero-sequence shunt, per indicator the admittance of the network on its
/// forward side. A fault then costs O(1) to solve and O(1) per indicator to read, so every
/// indicator's response to a fault on every segment costs segments × indicators.
/// </summary>
public sealed class FaultResponseModel
{
    private readonly SubstationTerms[] _substations;
    private readonly MeasuringPoint[] _indicators;
    private readonly Complex[] _segmentZ1Ohm;
    private readonly Complex[] _segmentZ0Ohm;
    private readonly bool[] _suppliedFromFrom;

    public FaultResponseModel(EnergisedNetwork network, double voltageFactor = SourceImpedance.VoltageFactorMaxMediumVoltage)
    {
        ArgumentNullException.ThrowIfNull(network);
        SourceImpedance.CheckVoltageFactor(voltageFactor);
        Network = network;
        Aggregates = NetworkAggregates.Of(network);
        VoltageFactor = voltageFactor;
        var grid = network.Grid;
        var omega = grid.AngularFrequencyRadPerS;
        _substations = [.. grid.Substations.Select((s, i) => new SubstationTerms(
            Units.PhaseVoltageV(s.NominalVoltageKv, voltageFactor),
            SourceImpedance.AtBusbarOhm(s, voltageFactor),
            NeutralAdmittance.AtBus(s, Aggregates.TotalCapacitanceF(i), omega),
            NeutralAdmittance.OfNeutral(s, Aggregates.TotalCapacitanceF(i), omega),
            s.Grounding.DampingPercent))];
        _indicators = [.. grid.Indicators.Select(Compile)];
        _segmentZ1Ohm = new Complex[grid.Segments.Length];
        _segmentZ0Ohm = new Complex[grid.Segments.Length];
        _suppliedFromFrom = new bool[grid.Segments.Length];
        for (var i = 0; i < grid.Segments.Length; i++)
        {
            var segment = grid.Segments[i];
            var type = grid.LineTypeOf(segment);
            _segmentZ1Ohm[i] = new Complex(type.R1OhmPerKm, type.X1OhmPerKm) * segment.LengthKm;
            _segmentZ0Ohm[i] = new Complex(type.R0OhmPerKm, type.X0OhmPerKm) * segment.LengthKm;
            _suppliedFromFrom[i] = grid.NodeIndex(segment.From) == network.SuppliedEndOf(i);
        }
    }

    public EnergisedNetwork Network { get; }

    /// <summary>The path impedances and capacitances of <see cref="Network"/>.</summary>
    public NetworkAggregates Aggregates { get; }

    public double VoltageFactor { get; }

    public Grid Grid => Network.Grid;

    /// <summary>Solves a fault on segment index <paramref name="segment"/> at <paramref name="position"/> (fraction from its from node).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public FaultSolution Solve(int segment, double position, FaultType type, double faultResistanceOhm) =>
        Solve(Place(segment, position), type, faultResistanceOhm);

    /// <summary>
    /// The part of a fault's solution that depends on where it lies, not on its type or resistance: the
    /// path impedances to <paramref name="position"/> (fraction from the from node) of segment index
    /// <paramref name="segment"/>. Solving many faults at one place reuses it.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal FaultPlace Place(int segment, double position)
    {
        if (!(position is >= 0 and <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(position), position, "position is a fraction of the segment's length from its from node: 0 to 1");
        }

        var up = Network.SuppliedEndOf(segment);
        if (up < 0)
        {
            var dead = Grid.Segments[segment].Id;
            throw new FaultCaseException($"segment {dead} is not energised in this switching state; a fault there drives no current", dead);
        }

        var sub = Network.SubstationIndexOf(up);
        var fromSupply = _suppliedFromFrom[segment] ? position : 1 - position;
        var z1 = _substations[sub].SourceOhm + Aggregates.PositiveSequencePathOhm(up) + (_segmentZ1Ohm[segment] * fromSupply);
        var z0Path = Aggregates.ZeroSequencePathOhm(up) + (_segmentZ0Ohm[segment] * fromSupply);
        return new FaultPlace(segment, up, sub, z1, z0Path);
    }

    /// <summary>Solves a fault of <paramref name="type"/> through <paramref name="faultResistanceOhm"/> at a <see cref="Place"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal FaultSolution Solve(in FaultPlace place, FaultType type, double faultResistanceOhm)
    {
        var terms = _substations[place.Substation];
        var currents = SequenceFault.Solve(type, terms.PhaseVoltageV, place.PositiveSequenceOhm, place.ZeroSequencePathOhm, terms.ZeroSequenceBusS, faultResistanceOhm);
        return new FaultSolution(type, place.Segment, place.SuppliedNode, place.Substation, place.PositiveSequenceOhm, place.ZeroSequencePathOhm, terms.PhaseVoltageV, currents,
            SequenceFault.FaultedPhaseCurrentA(type, currents));
    }

    /// <summary>
    /// Bounds of |U0| at the bus over the earth faults of <paramref name="type"/> (LG or LLG) on segment index
    /// <paramref name="segment"/>, at a share of its length from its supplied end within
    /// [<paramref name="fromSupplyMin"/>, <paramref name="fromSupplyMax"/>] and a fault resistance within
    /// [<paramref name="resistanceMinOhm"/>, <paramref name="resistanceMaxOhm"/>]. U0 = ∓E/d, and the
    /// denominator d of <see cref="SequenceFault"/> is affine in both the position and the resistance, so |d|
    /// is largest at a corner of the parallelogram they span and smallest at its point nearest to 0. The
    /// bounds are widened by a relative 1e-9 against rounding; the maximum is +∞ where d can vanish.
    /// Short circuits (LL, LLL) drive no zero-sequence current: 0 and 0.
    /// </summary>
    internal (double MinV, double MaxV) NeutralVoltageRangeV(int segment, FaultType type, double fromSupplyMin, double fromSupplyMax, double resistanceMinOhm, double resistanceMaxOhm)
    {
        if (type is FaultType.LL or FaultType.LLL)
        {
            return (0, 0);
        }

        var up = Network.SuppliedEndOf(segment);
        var terms = _substations[Network.SubstationIndexOf(up)];
        var y0 = terms.ZeroSequenceBusS;
        var z1Up = terms.SourceOhm + Aggregates.PositiveSequencePathOhm(up);
        var z0Up = Aggregates.ZeroSequencePathOhm(up);
        // d = origin + share·alongSegment + Rf·perOhm.
        var (origin, alongSegment, perOhm) = type == FaultType.LG
            ? (1 + (y0 * ((2 * z1Up) + z0Up)), y0 * ((2 * _segmentZ1Ohm[segment]) + _segmentZ0Ohm[segment]), 3 * y0)
            : (2 + (y0 * (z1Up + (2 * z0Up))), y0 * (_segmentZ1Ohm[segment] + (2 * _segmentZ0Ohm[segment])), 6 * y0);
        var corner = origin + (fromSupplyMin * alongSegment) + (resistanceMinOhm * perOhm);
        var u = (fromSupplyMax - fromSupplyMin) * alongSegment;
        var v = (resistanceMaxOhm - resistanceMinOhm) * perOhm;
        Span<Complex> corners = [corner, corner + u, corner + u + v, corner + v];
        var largest = 0.0;
        var nearest = double.PositiveInfinity;
        for (var k = 0; k < 4; k++)
        {
            largest = Math.Max(largest, corners[k].Magnitude);
            nearest = Math.Min(nearest, DistanceFromZero(corners[k], corners[(k + 1) % 4]));
        }

        // Zero inside the parallelogram: corner + s·u + t·v = 0 with s and t within [0, 1].
        var cross = (u.Real * v.Imaginary) - (u.Imaginary * v.Real);
        if (cross != 0)
        {
            var s = ((-corner.Real * v.Imaginary) + (corner.Imaginary * v.Real)) / cross;
            var t = ((u.Real * -corner.Imaginary) + (u.Imaginary * corner.Real)) / cross;
            if (s is >= 0 and <= 1 && t is >= 0 and <= 1)
            {
                nearest = 0;
            }
        }

        // Rounding: d is computed in another order in the solution; allow for it absolutely and relatively.
        var slack = 1e-12 * (corner.Magnitude + u.Magnitude + v.Magnitude + 1);
        (largest, nearest) = (largest + slack, nearest - slack);
        var e = terms.PhaseVoltageV;
        const double Rounding = 1e-9;
        return (e / largest * (1 - Rounding), nearest > 0 ? e / nearest * (1 + Rounding) : double.PositiveInfinity);
    }

    /// <summary>The distance from 0 to the straight piece from <paramref name="a"/> to <paramref name="b"/>.</summary>
    private static double DistanceFromZero(Complex a, Complex b)
    {
        var ab = b - a;
        var length = (ab.Real * ab.Real) + (ab.Imaginary * ab.Imaginary);
        var t = length > 0 ? Math.Clamp(-((a.Real * ab.Real) + (a.Imaginary * ab.Imaginary)) / length, 0, 1) : 0;
        return (a + (t * ab)).Magnitude;
    }

    /// <summary>What indicator index <paramref name="indicator"/> sees for a solved fault.</summary>
    public IndicatorReading Read(in FaultSolution fault, int indicator) => ReadAt(_indicators[indicator], fault);

    /// <summary>The compiled measuring point of indicator index <paramref name="indicator"/>.</summary>
    internal MeasuringPoint IndicatorPoint(int indicator) => _indicators[indicator];

    /// <summary>
    /// A measuring point at switch index <paramref name="device"/> looking away from the source (a feeder
    /// breaker's CTs: currents toward the feeder), without pickups. Dead or open switches measure nothing.
    /// </summary>
    internal MeasuringPoint SwitchPoint(int device)
    {
        var d = Grid.Switches[device];
        var a = Grid.NodeIndex(d.From);
        var b = Grid.NodeIndex(d.To);
        var edge = new Topology.EdgeRef(Topology.EdgeKind.Switch, device);
        var far = Network.FeedingEdgeOf(b) == edge ? b : Network.FeedingEdgeOf(a) == edge ? a : -1;
        if (far < 0)
        {
            return new MeasuringPoint(-1, -1, true, -1, 0, 0, double.NaN, double.NaN, false);
        }

        var sub = Network.SubstationIndexOf(far);
        var terms = _substations[sub];
        var forward = NeutralAdmittance.OfCapacitance(Aggregates.CapacitanceAtOrBeyondF(far), Grid.AngularFrequencyRadPerS, terms.DampingPercent);
        return new MeasuringPoint(sub, far, true, -1, 3 * forward.Magnitude, 3 * (forward - terms.ZeroSequenceBusS).Magnitude, double.NaN, double.NaN, false);
    }

    /// <summary>True when a fault on segment index <paramref name="segment"/> lies on the point's forward side (both energised, same network).</summary>
    internal bool IsFaultBeyond(in MeasuringPoint p, int segment)
    {
        var up = Network.SuppliedEndOf(segment);
        if (p.Substation < 0 || up < 0 || Network.SubstationIndexOf(up) != p.Substation)
        {
            return false;
        }

        var beyondFarEnd = Network.IsAtOrBeyond(p.FarNode, up);
        return p.SelfSegment == segment || (p.AwayFromSource ? beyondFarEnd : !beyondFarEnd);
    }

    /// <summary>The complete result of a fault: currents, voltages and every indicator's response.</summary>
    public FaultResult Compute(FaultCase fault)
    {
        ArgumentNullException.ThrowIfNull(fault);
        if (!Grid.HasSegment(fault.Segment))
        {
            throw new FaultCaseException($"segment {fault.Segment} is not in the grid", fault.Segment);
        }

        if (Math.Abs(fault.VoltageFactor - VoltageFactor) > 1e-12)
        {
            return new FaultResponseModel(Network, fault.VoltageFactor).Compute(fault);
        }

        var solution = Solve(Grid.SegmentIndex(fault.Segment), fault.Position, fault.Type, fault.FaultResistanceOhm);
        var responses = ImmutableArray.CreateBuilder<IndicatorResponse>(_indicators.Length);
        for (var i = 0; i < _indicators.Length; i++)
        {
            var reading = Read(solution, i);
            responses.Add(new IndicatorResponse(Grid.Indicators[i].Id, reading.PhaseCurrentA, reading.ResidualCurrentA, reading.FaultBeyond, reading.Expected));
        }

        return new FaultResult(
            fault,
            Grid.Substations[solution.Substation].Id,
            SequenceFault.FaultCurrentA(fault.Type, solution.Currents),
            solution.FaultedPhaseCurrentA,
            solution.Currents.NeutralVoltageAtBusV.Magnitude,
            HealthyPhaseVoltagesV(solution),
            responses.MoveToImmutable());
    }

    private static ImmutableArray<double> HealthyPhaseVoltagesV(in FaultSolution s)
    {
        if (s.Type is FaultType.LL or FaultType.LLL)
        {
            return [];
        }

        var c = s.Currents;
        var u1 = s.PhaseVoltageV - (s.PositiveSequenceOhm * c.PositiveA);
        var u2 = -s.PositiveSequenceOhm * c.NegativeA;
        var u0 = c.NeutralVoltageAtBusV - (s.ZeroSequencePathOhm * c.ZeroA);
        var (a, b, cc) = SymmetricalComponents.ToPhases(u0, u1, u2);
        return s.Type == FaultType.LG ? [b.Magnitude, cc.Magnitude] : [a.Magnitude];
    }

    private IndicatorReading ReadAt(in MeasuringPoint p, in FaultSolution fault)
    {
        if (p.Substation < 0 || p.Substation != fault.Substation)
        {
            return new IndicatorReading(0, 0, false, IndicatorState.None);
        }

        var beyondFarEnd = Network.IsAtOrBeyond(p.FarNode, fault.SuppliedNode);
        var faultBeyond = p.SelfSegment == fault.Segment || (p.AwayFromSource ? beyondFarEnd : !beyondFarEnd);
        var onPath = p.OnPath(faultBeyond);

        // 3I0 = 3·Y0B·U0bus + [F in B]·I_E with I_E = −3·Y0bus·U0bus, so |3I0| = |U0bus|·3·|Y0B − [F in B]·Y0bus|:
        // one gain per side, fixed by the topology, times the fault's neutral displacement.
        var residualA = fault.NeutralVoltageMagnitudeV * (faultBeyond ? p.BeyondGainS : p.NotBeyondGainS);
        var phaseA = onPath ? fault.FaultedPhaseCurrentA : 0;
        var expected = p.ExpectedState(phaseA, residualA, faultBeyond);
        return new IndicatorReading(phaseA, residualA, faultBeyond, expected);
    }

    private MeasuringPoint Compile(Indicator indicator)
    {
        var segment = Grid.SegmentIndex(indicator.Segment);
        var phase = indicator.PhasePickupA ?? double.NaN;
        var earth = indicator.EarthPickupA ?? double.NaN;
        var up = Network.SuppliedEndOf(segment);
        if (up < 0)
        {
            return new MeasuringPoint(-1, -1, false, segment, 0, 0, phase, earth, indicator.Directional);
        }

        var sub = Network.SubstationIndexOf(up);
        var terms = _substations[sub];
        var far = Network.FarEndOf(segment);
        var away = Grid.NodeIndex(indicator.Node) == up;
        var omega = Grid.AngularFrequencyRadPerS;
        Complex forward;
        if (away)
        {
            forward = NeutralAdmittance.OfCapacitance(Aggregates.CapacitanceAtOrBeyondF(far), omega, terms.DampingPercent);
        }
        else
        {
            var seg = Grid.Segments[segment];
            var own = Units.FaradsPerKm(Grid.LineTypeOf(seg).C0NfPerKm) * seg.LengthKm;
            var capacitanceF = Aggregates.TotalCapacitanceF(sub) - Aggregates.CapacitanceAtOrBeyondF(far) + own;
            forward = NeutralAdmittance.OfCapacitance(capacitanceF, omega, terms.DampingPercent) + terms.NeutralS;
        }

        return new MeasuringPoint(sub, far, away, segment, 3 * forward.Magnitude, 3 * (forward - terms.ZeroSequenceBusS).Magnitude,
            phase, earth, indicator.Directional);
    }

    private readonly record struct SubstationTerms(
        double PhaseVoltageV, Complex SourceOhm, Complex ZeroSequenceBusS, Complex NeutralS, double DampingPercent);
}

/// <summary>Where a fault lies: its segment, the segment's supplied end and substation, and the path impedances to it.</summary>
internal readonly record struct FaultPlace(int Segment, int SuppliedNode, int Substation, Complex PositiveSequenceOhm, Complex ZeroSequencePathOhm);

/// <summary>A solved fault, ready for reading indicators.</summary>
public readonly record struct FaultSolution(
    FaultType Type,
    int Segment,
    int SuppliedNode,
    int Substation,
    Complex PositiveSequenceOhm,
    Complex ZeroSequencePathOhm,
    double PhaseVoltageV,
    SequenceCurrents Currents,
    double FaultedPhaseCurrentA)
{
    /// <summary>|U0| at the bus, V.</summary>
    public double NeutralVoltageMagnitudeV { get; } = Currents.NeutralVoltageAtBusV.Magnitude;
}

/// <summary>One indicator's currents for a fault and its expected state.</summary>
public readonly record struct IndicatorReading(double PhaseCurrentA, double ResidualCurrentA, bool FaultBeyond, IndicatorState Expected);
