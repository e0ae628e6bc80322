using System.Collections.Immutable;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Evaluation;

/// <summary>
/// Makes incidents with the reference model: a segment drawn by its prior fault rate, a uniform position,
/// a fault type and resistance suited to the grounding, every indicator's expected state corrupted at
/// the given rates, and noisy substation records at the feeder breakers.
/// </summary>
public sealed class IncidentSimulator
{
    private static readonly DateTimeOffset Start = new(2026, 1, 1, 0, 0, 0, TimeSpan.Zero);
    private readonly Grid _grid;
    private readonly EnergisedNetwork _network;
    private readonly FaultResponseModel _model;
    private readonly SimulationSettings _settings;
    private readonly int[] _segments;
    private readonly double[] _cumulativeWeight;
    private readonly RankingPriors _truePriors;

    public IncidentSimulator(NetworkGraph graph, SimulationSettings settings, RankingPriors? truePriors = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(settings);
        settings.Validate();
        _grid = graph.Grid;
        _settings = settings;
        _network = graph.Energise(SwitchStates.Normal(_grid));
        _model = new FaultResponseModel(_network);
        _truePriors = truePriors ?? RankingPriors.None;
        _segments = [.. Enumerable.Range(0, _grid.Segments.Length).Where(_network.IsSegmentEnergised)];
        _cumulativeWeight = new double[_segments.Length];
        var sum = 0.0;
        for (var k = 0; k < _segments.Length; k++)
        {
            sum += _truePriors.FaultsPerYear(_grid, _grid.Segments[_segments[k]]);
            _cumulativeWeight[k] = sum;
        }
    }

    /// <summary>1 / (the grid's expected faults per year): incident n is reported n such intervals after the start.</summary>
    public TimeSpan MeanIntervalBetweenFaults => TimeSpan.FromDays(365.25 / Math.Max(1e-6, _cumulativeWeight[^1]));

    public SimulatedIncident Next(Random random, int number)
    {
        ArgumentNullException.ThrowIfNull(random);
        var segment = DrawSegment(random);
        var position = random.NextDouble();
        var substation = _grid.Substations[_network.SubstationIndexOf(_network.SuppliedEndOf(segment))];
        var lowCurrent = substation.Grounding.Scheme is GroundingScheme.Isolated or GroundingScheme.Resonant;
        var (type, rf) = DrawFault(random, lowCurrent);
        if (_settings.HighResistanceShare > 0 && !lowCurrent && type == FaultType.LG && random.NextDouble() < _settings.HighResistanceShare)
        {
            rf = 200 * Math.Pow(25, random.NextDouble());
        }

        return At(_grid.Segments[segment].Id, position, type, rf, random, number);
    }

    /// <summary>
    /// The incident of a given fault: indications corrupted at the settings' rates, noisy records and,
    /// where asked for, the protection context. An earth fault trips nothing on isolated and resonant
    /// networks, nor through 200 Ω or more on solid and impedance ones (a high-resistance fault).
    /// </summary>
    public SimulatedIncident At(SegmentId faulted, double position, FaultType type, double faultResistanceOhm, Random random, int number = 0)
    {
        ArgumentNullException.ThrowIfNull(random);
        var segment = _grid.SegmentIndex(faulted);
        var rf = faultResistanceOhm;
        var substation = _grid.Substations[_network.SubstationIndexOf(_network.SuppliedEndOf(segment))];
        var lowCurrent = substation.Grounding.Scheme is GroundingScheme.Isolated or GroundingScheme.Resonant;
        var fault = _model.Solve(segment, position, type, rf);
        var trips = !(type == FaultType.LG && (lowCurrent || rf >= HighResistanceOhm));
        var reportedAt = Start + (MeanIntervalBetweenFaults * number);

        var indications = ImmutableArray.CreateBuilder<Indication>();
        for (var i = 0; i < _grid.Indicators.Length; i++)
        {
            if (random.NextDouble() < _settings.UnknownProbability)
            {
                continue;
            }

            var indicator = _grid.Indicators[i];
            var state = Corrupt(_model.Read(fault, i).Expected, indicator, random);
            indications.Add(new Indication(indicator.Id, state, indicator.Remote ? IndicationSource.Remote : IndicationSource.Field));
        }

        var incident = new Incident(
            reportedAt,
            null,
            ImmutableDictionary<SwitchId, SwitchPosition>.Empty,
            trips ? TrippingDevice(segment) : null,
            type,
            Records(segment, fault, trips, random),
            indications.ToImmutable());
        if (_settings.ProtectionContext)
        {
            incident = ProtectionContext(incident, segment, position, fault, random);
        }

        return new SimulatedIncident(incident, _grid.Segments[segment].Id, position, type, rf);
    }

    /// <summary>Fault resistance from which an earth fault on a solid or impedance network trips nothing, Ω (common practice).</summary>
    public const double HighResistanceOhm = 200;

    private int DrawSegment(Random random)
    {
        var target = random.NextDouble() * _cumulativeWeight[^1];
        var k = Array.BinarySearch(_cumulativeWeight, target);
        return _segments[Math.Min(_segments.Length - 1, k < 0 ? ~k : k)];
    }

    /// <summary>Earth faults are most common; their resistance spans ohms to kΩ where earthing keeps the current low (common practice).</summary>
    private static (FaultType Type, double FaultResistanceOhm) DrawFault(Random random, bool lowCurrent)
    {
        var u = random.NextDouble();
        var type = u < 0.7 ? FaultType.LG : u < 0.8 ? FaultType.LL : u < 0.9 ? FaultType.LLG : FaultType.LLL;
        var rf = type switch
        {
            FaultType.LG or FaultType.LLG when lowCurrent => Math.Exp(random.NextDouble() * Math.Log(3000)),
            FaultType.LG or FaultType.LLG => random.NextDouble() * 20,
            _ => random.NextDouble() * 3,
        };
        return (type, rf);
    }

    /// <summary>
    /// What the protection reports: every feeder breaker's earth-fault direction, the fault locator at the
    /// tripped feeder breaker, the reclosing sequence of the tripping breaker or recloser (locked out: the
    /// fault is permanent) and the fuses of the faulted feeder found blown (the one that cleared it) or intact.
    /// </summary>
    private Incident ProtectionContext(Incident incident, int segment, double position, in FaultSolution fault, Random random)
    {
        var earth = fault.Type is FaultType.LG or FaultType.LLG;
        var sub = fault.Substation;
        var relays = ImmutableArray.CreateBuilder<RelayResult>();
        var tripped = incident.TrippedDevice;
        var head = FeederBreaker(segment);
        for (var d = 0; d < _grid.Switches.Length; d++)
        {
            var device = _grid.Switches[d];
            if (device.Kind != SwitchKind.Breaker || !_grid.Substations.Any(s => s.BusNode == device.From || s.BusNode == device.To))
            {
                continue;
            }

            var point = _model.SwitchPoint(d);
            var expected = !earth || point.Substation != sub ? EarthFaultDirection.None
                : _model.IsFaultBeyond(point, segment) ? EarthFaultDirection.Forward : EarthFaultDirection.Reverse;
            var direction = random.NextDouble() < _settings.RelayErrorProbability
                ? (EarthFaultDirection)((int)(expected + 1 + random.Next(2)) % 3)
                : expected;
            var lowCurrentEarth = fault.Type == FaultType.LG && _grid.Substations[sub].Grounding.Scheme is GroundingScheme.Isolated or GroundingScheme.Resonant;
            double? reactance = tripped is not null && device.Id == head && !lowCurrentEarth
                ? Math.Max(0, LineReactanceOhm(segment, position) * (1 + (_settings.ReactanceNoiseRelative * Normal(random))))
                : null;
            relays.Add(new RelayResult(device.Id, direction, reactance));
        }

        var fuses = ImmutableDictionary.CreateBuilder<SwitchId, FuseCondition>();
        var feeder = head is { } h ? _model.SwitchPoint(_grid.SwitchIndex(h)) : default;
        for (var d = 0; d < _grid.Switches.Length; d++)
        {
            var device = _grid.Switches[d];
            if (device.Kind == SwitchKind.Fuse && head is not null && FirstSegmentBeyond(d) is var first and >= 0 && _model.IsFaultBeyond(feeder, first))
            {
                fuses[device.Id] = device.Id == tripped ? FuseCondition.Blown : FuseCondition.Intact;
            }
        }

        Reclosing? reclosing = tripped is { } t && _grid.Switch(t).Kind is SwitchKind.Breaker or SwitchKind.Recloser
            ? new Reclosing(t, 2, ReclosingResult.Lockout)
            : null;
        return incident with { FaultAt = incident.ReportedAt.AddMinutes(-2), Relays = relays.ToImmutable(), Fuses = fuses.ToImmutable(), Reclosing = reclosing };
    }

    /// <summary>Σ x1·length from the bus to the fault point, Ω: what a fault locator at the feeder breaker measures.</summary>
    private double LineReactanceOhm(int segment, double position)
    {
        var seg = _grid.Segments[segment];
        var up = _network.SuppliedEndOf(segment);
        var fromSupply = _grid.NodeIndex(seg.From) == up ? position : 1 - position;
        return _network.PositiveSequencePathOhm(up).Imaginary + (fromSupply * seg.LengthKm * _grid.LineTypeOf(seg).X1OhmPerKm);
    }

    /// <summary>A segment fed through switch <paramref name="device"/>, or −1 where none is (its far side is dead or switch-only).</summary>
    private int FirstSegmentBeyond(int device)
    {
        var point = _model.SwitchPoint(device);
        if (point.Substation < 0)
        {
            return -1;
        }

        for (var s = 0; s < _grid.Segments.Length; s++)
        {
            if (_network.IsSegmentEnergised(s) && _network.SuppliedEndOf(s) == point.FarNode)
            {
                return s;
            }
        }

        return -1;
    }

    /// <summary>The breaker at the head of the segment's feeder.</summary>
    private SwitchId? FeederBreaker(int segment)
    {
        foreach (var edge in _network.PathFromSource(_grid.Nodes[_network.SuppliedEndOf(segment)].Id))
        {
            if (edge.Kind == EdgeKind.Switch && _grid.Switches[edge.Index].Kind == SwitchKind.Breaker)
            {
                return _grid.Switches[edge.Index].Id;
            }
        }

        return null;
    }

    private IndicatorState Corrupt(IndicatorState expected, Indicator indicator, Random random)
    {
        if (expected != IndicatorState.None)
        {
            return random.NextDouble() < _settings.MissProbability ? IndicatorState.None : expected;
        }

        if (random.NextDouble() >= _settings.FalseProbabilityOf(indicator.Id))
        {
            return IndicatorState.None;
        }

        return !indicator.Directional ? IndicatorState.Fault
            : random.Next(2) == 0 ? IndicatorState.Forward : IndicatorState.Reverse;
    }

    /// <summary>The protective device nearest the fault on its path from the source: it clears the fault.</summary>
    private SwitchId? TrippingDevice(int segment)
    {
        var path = _network.PathFromSource(_grid.Nodes[_network.SuppliedEndOf(segment)].Id);
        for (var k = path.Count - 1; k >= 0; k--)
        {
            if (path[k].Kind == EdgeKind.Switch && _grid.Switches[path[k].Index].Kind is SwitchKind.Breaker or SwitchKind.Recloser or SwitchKind.Fuse)
            {
                return _grid.Switches[path[k].Index].Id;
            }
        }

        return null;
    }

    /// <summary>Records at every feeder breaker of the faulted substation: residual and neutral voltage; phase current where it tripped.</summary>
    private ImmutableArray<SubstationMeasurement> Records(int segment, in FaultSolution fault, bool trips, Random random)
    {
        var records = ImmutableArray.CreateBuilder<SubstationMeasurement>();
        var bus = _grid.Substations[fault.Substation].BusNode;
        for (var d = 0; d < _grid.Switches.Length; d++)
        {
            var device = _grid.Switches[d];
            if (device.Kind != SwitchKind.Breaker || (device.From != bus && device.To != bus))
            {
                continue;
            }

            var point = _model.SwitchPoint(d);
            var beyond = _model.IsFaultBeyond(point, segment);
            var u0 = fault.NeutralVoltageMagnitudeV;
            var residual = u0 * (beyond ? point.BeyondGainS : point.NotBeyondGainS);
            var earth = fault.Type is FaultType.LG or FaultType.LLG;
            records.Add(new SubstationMeasurement(
                device.Id,
                trips && beyond ? Noisy(fault.FaultedPhaseCurrentA, random) : null,
                earth ? Noisy(residual, random) : null,
                earth ? Noisy(u0, random) : null));
        }

        return records.ToImmutable();
    }

    private double Noisy(double value, Random random) =>
        Math.Max(0, value * (1 + (_settings.RecordNoiseRelative * Normal(random))));

    /// <summary>Box–Muller: a standard normal draw.</summary>
    private static double Normal(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
}
