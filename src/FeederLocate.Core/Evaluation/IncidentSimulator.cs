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
        var fault = _model.Solve(segment, position, type, rf);
        var trips = !(lowCurrent && type == FaultType.LG);
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
        return new SimulatedIncident(incident, _grid.Segments[segment].Id, position, type, rf);
    }

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

        // A false flag's direction is drawn only for directional indicators, as before: the draw sequence is part of the seed.
        return indicator.PickedUpState(indicator.Directional && random.Next(2) == 0);
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

    private double Noisy(double value, Random random)
    {
        // Box–Muller: a standard normal draw.
        var z = Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
        return Math.Max(0, value * (1 + (_settings.RecordNoiseRelative * z)));
    }
}
