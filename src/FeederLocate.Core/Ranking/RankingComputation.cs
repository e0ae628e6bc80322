using System.Collections.Immutable;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// One ranking: every energised segment a hypothesis, its likelihood marginalised over fault type,
/// fault resistance and (for the substation records) position, times its prior.
/// Indications are compared at the segment's midpoint, so the cost is segments × indicators × resistances.
/// </summary>
internal sealed class RankingComputation
{
    private static readonly double[] RefinedPositions = [0.05, 0.25, 0.5, 0.75, 0.95];
    private static readonly ImmutableArray<double> MidpointOnly = [0.5];
    private readonly bool[] _lowCurrentEarthFault;
    private readonly Grid _grid;
    private readonly Incident _incident;
    private readonly RankingOptions _options;
    private readonly RankingPriors _priors;
    private readonly NetworkGraph _graph;
    private readonly FaultResponseModel _model;
    private readonly List<ObservedIndication> _observed;
    private readonly List<MeasuredRecord> _measured;
    private readonly MeasuringPoint? _trip;
    private readonly List<IndicatorId> _leftOut = [];
    private readonly ImmutableArray<FaultTypePlan>[] _plans;
    private readonly bool[] _beyond;
    private readonly bool[] _measuredBeyond;
    private readonly IndicationSums _sums;
    private readonly RecordSums _records;
    private readonly List<int> _recordsBeyond = [];

    public RankingComputation(NetworkGraph graph, Incident incident, RankingOptions options, RankingPriors priors)
    {
        _graph = graph;
        _grid = graph.Grid;
        _incident = incident;
        _options = options;
        _priors = priors;
        if (!graph.TryEnergise(SwitchStates.AtFaultTime(_grid, incident), out var network, out var problem))
        {
            throw new RankingException($"the incident's switch states give no radial network: {problem}");
        }

        Network = network!;
        _model = new FaultResponseModel(Network);
        _observed = EvidencePoints.Indications(_grid, incident, _model, options, priors, _leftOut);
        _measured = EvidencePoints.Measurements(_grid, incident, _model);
        _trip = incident.TrippedDevice is { } tripped ? _model.SwitchPoint(_grid.SwitchIndex(tripped)) : null;
        _plans = [.. _grid.Substations.Select(s => HypothesisPlan.For(s.Grounding.Scheme, incident, options))];
        _beyond = new bool[_observed.Count];
        _measuredBeyond = new bool[_measured.Count];
        _sums = new IndicationSums(_model, _observed);
        _lowCurrentEarthFault = [.. _grid.Substations.Select(s => s.Grounding.Scheme is GroundingScheme.Isolated or GroundingScheme.Resonant)];
        _records = new RecordSums(this, _measured, _model);
    }

    public EnergisedNetwork Network { get; }

    internal FaultResponseModel Model => _model;

    internal IReadOnlyList<ObservedIndication> Observed => _observed;

    internal IReadOnlyList<MeasuredRecord> Measured => _measured;

    internal IReadOnlyList<IndicatorId> LeftOut => _leftOut;

    internal Incident Incident => _incident;

    internal RankingOptions Options => _options;

    internal NetworkGraph Graph => _graph;

    /// <summary>Scores every energised segment.</summary>
    public List<SegmentScore> ScoreSegments()
    {
        var scores = new List<SegmentScore>();
        for (var s = 0; s < _grid.Segments.Length; s++)
        {
            if (Network.IsSegmentEnergised(s))
            {
                scores.Add(Score(s));
            }
        }

        if (scores.Count == 0)
        {
            throw new RankingException("no segment is energised in the incident's switch states: nothing to rank");
        }

        return scores;
    }

    /// <summary>
    /// The best hypothesis on a segment over a finer grid of fault resistance and position, with every
    /// indication and record evaluated at the same point: what the consistency judgement rests on, so
    /// the coarse grid of the ranking does not make a true explanation look wrong.
    /// </summary>
    public BestHypothesis Refine(int segment)
    {
        var sub = Network.SubstationIndexOf(Network.SuppliedEndOf(segment));
        var trip = TripLogFactor(segment);
        var best = new BestHypothesis(FaultType.LG, 0, 0.5, double.NegativeInfinity);
        var beyond = Enumerable.Range(0, _measured.Count)
            .Where(m => _measured[m].Point.Substation == sub && _model.IsFaultBeyond(_measured[m].Point, segment)).ToList();
        foreach (var plan in _plans[sub])
        {
            foreach (var rf in FineResistances(plan.ResistancesOhm))
            {
                foreach (var position in RefinedPositions)
                {
                    // The shortcut sums, equal to the plain ones (see the tests), at every point of the finer grid.
                    var fault = _model.Solve(segment, position, plan.Type, rf);
                    var log = _sums.LogLikelihood(segment, fault) + _records.LogLikelihood(fault, beyond) + trip;
                    if (log > best.LogLikelihood)
                    {
                        best = new BestHypothesis(plan.Type, rf, position, log);
                    }
                }
            }
        }

        return best;
    }

    /// <summary>The fault resistances considered for a type on the segment's network, on the fine grid.</summary>
    public IReadOnlyList<double> FineResistancesFor(int segment, FaultType type)
    {
        var sub = Network.SubstationIndexOf(Network.SuppliedEndOf(segment));
        var plan = _plans[sub].FirstOrDefault(p => p.Type == type) ?? _plans[sub][0];
        return [.. FineResistances(plan.ResistancesOhm)];
    }

    /// <summary>The coarse grid with 3 log-spaced values between each pair of its points.</summary>
    private static IEnumerable<double> FineResistances(ImmutableArray<double> coarse)
    {
        for (var k = 0; k < coarse.Length; k++)
        {
            yield return coarse[k];
            if (k + 1 < coarse.Length)
            {
                var (a, b) = (Math.Max(coarse[k], 0.2), coarse[k + 1]);
                for (var j = 1; j <= 3; j++)
                {
                    yield return a * Math.Pow(b / a, j / 4.0);
                }
            }
        }
    }

    /// <summary>Log-factor of the tripped device: 0 where it would have seen the fault, log(ε) elsewhere.</summary>
    public double TripLogFactor(int segment) =>
        _trip is not { } trip || _model.IsFaultBeyond(trip, segment) ? 0 : Math.Log(_options.OutsideTrippedZoneFactor);

    /// <summary>The expected state of every observed indicator for a fault on the segment.</summary>
    public IndicatorState[] ExpectedStates(int segment, in FaultSolution fault)
    {
        FillBeyond(segment);
        var states = new IndicatorState[_observed.Count];
        for (var i = 0; i < states.Length; i++)
        {
            states[i] = Expected(i, fault);
        }

        return states;
    }

    /// <summary>Σ log P(record | expected) over the observed indications, indicator by indicator (the slow, plain sum).</summary>
    public double IndicationLogLikelihoodDirect(int segment, in FaultSolution fault)
    {
        var expected = ExpectedStates(segment, fault);
        return _observed.Select((o, i) => o.LogProbability(expected[i])).Sum();
    }

    /// <summary>Σ log-likelihood of the substation records, record by record (the slow, plain sum).</summary>
    public double RecordLogLikelihoodDirect(int segment, in FaultSolution fault)
    {
        var total = 0.0;
        foreach (var record in _measured)
        {
            total += RecordLogLikelihood(record.Measurement, Predicted(record, segment, fault));
        }

        return total;
    }

    /// <summary>The same sum through the tabulated shortcut the ranking uses.</summary>
    public double RecordLogLikelihoodFast(int segment, in FaultSolution fault)
    {
        var sub = fault.Substation;
        var beyond = Enumerable.Range(0, _measured.Count)
            .Where(m => _measured[m].Point.Substation == sub && _model.IsFaultBeyond(_measured[m].Point, segment)).ToList();
        return _records.LogLikelihood(fault, beyond);
    }

    /// <summary>The same sum through the sorted-threshold shortcut the ranking uses.</summary>
    public double IndicationLogLikelihood(int segment, in FaultSolution fault) => _sums.LogLikelihood(segment, fault);

    /// <summary>The value a record's device would have measured for a solved fault.</summary>
    public (double PhaseA, double ResidualA, double NeutralV) Predicted(MeasuredRecord record, int segment, in FaultSolution fault)
    {
        var point = record.Point;
        var same = point.Substation >= 0 && point.Substation == fault.Substation;
        var beyond = same && _model.IsFaultBeyond(point, segment);
        return Predicted(point, same, beyond, fault);
    }

    private static (double PhaseA, double ResidualA, double NeutralV) Predicted(in MeasuringPoint point, bool same, bool beyond, in FaultSolution fault)
    {
        if (!same)
        {
            return (0, 0, 0);
        }

        var u0 = fault.NeutralVoltageMagnitudeV;
        return (beyond ? fault.FaultedPhaseCurrentA : 0, u0 * (beyond ? point.BeyondGainS : point.NotBeyondGainS), u0);
    }

    private SegmentScore Score(int segment)
    {
        var sub = Network.SubstationIndexOf(Network.SuppliedEndOf(segment));
        _recordsBeyond.Clear();
        for (var m = 0; m < _measured.Count; m++)
        {
            var point = _measured[m].Point;
            _measuredBeyond[m] = point.Substation == sub && _model.IsFaultBeyond(point, segment);
            if (_measuredBeyond[m])
            {
                _recordsBeyond.Add(m);
            }
        }

        var tripLog = TripLogFactor(segment);
        var marginal = double.NegativeInfinity;
        var best = new BestHypothesis(FaultType.LG, 0, 0.5, double.NegativeInfinity);
        var byType = new Dictionary<FaultType, double>();
        foreach (var plan in _plans[sub])
        {
            var logWeight = plan.LogWeight - Math.Log(plan.ResistancesOhm.Length);
            var typeMarginal = double.NegativeInfinity;
            foreach (var rf in plan.ResistancesOhm)
            {
                var mid = _model.Solve(segment, 0.5, plan.Type, rf);
                var indications = _sums.LogLikelihood(segment, mid);

                var (records, position) = RecordsLikelihood(segment, plan.Type, rf, mid);
                var likelihood = indications + records;
                typeMarginal = LogMath.Add(typeMarginal, logWeight + likelihood);
                if (likelihood + tripLog > best.LogLikelihood)
                {
                    best = new BestHypothesis(plan.Type, rf, position, likelihood + tripLog);
                }
            }

            byType[plan.Type] = tripLog + typeMarginal;
            marginal = LogMath.Add(marginal, typeMarginal);
        }

        var logPrior = Math.Log(Math.Max(1e-12, _priors.FaultsPerYear(_grid, _grid.Segments[segment])));
        return new SegmentScore(segment, logPrior, tripLog + marginal, best, byType);
    }

    /// <summary>The substation records' likelihood averaged over positions, and the best-fitting position.</summary>
    private (double LogLikelihood, double BestPosition) RecordsLikelihood(int segment, FaultType type, double rf, in FaultSolution mid)
    {
        if (_measured.Count == 0)
        {
            return (0, 0.5);
        }

        var total = double.NegativeInfinity;
        var best = (Log: double.NegativeInfinity, Position: 0.5);
        // Where the earthing keeps an earth fault's current low, the records hardly change along a segment:
        // the midpoint stands for it (the finer check of the best explanation still uses every position).
        var positions = _lowCurrentEarthFault[mid.Substation] && type is FaultType.LG or FaultType.LLG ? MidpointOnly : _options.Positions;
        foreach (var position in positions)
        {
            var fault = position == 0.5 ? mid : _model.Solve(segment, position, type, rf);
            var log = _records.LogLikelihood(fault, _recordsBeyond);
            total = LogMath.Add(total, log);
            if (log > best.Log)
            {
                best = (log, position);
            }
        }

        return (total - Math.Log(positions.Length), best.Position);
    }

    internal double RecordLogLikelihood(SubstationMeasurement m, (double PhaseA, double ResidualA, double NeutralV) predicted)
    {
        var log = 0.0;
        if (m.PhaseCurrentA is { } phase)
        {
            log += MeasurementLikelihood.Log(_options.PhaseCurrentTolerance, phase, predicted.PhaseA);
        }

        // At a device with an earth fault beyond it on a solid or impedance network the residual current
        // is the faulted-phase current itself: the same information, counted once.
        var sameAsPhase = m.PhaseCurrentA is not null && predicted.PhaseA > 0
            && Math.Abs(predicted.ResidualA - predicted.PhaseA) <= 0.1 * predicted.PhaseA;
        if (m.ResidualCurrentA is { } residual && !sameAsPhase)
        {
            log += MeasurementLikelihood.Log(_options.ResidualCurrentTolerance, residual, predicted.ResidualA);
        }

        if (m.NeutralVoltageV is { } neutral)
        {
            log += MeasurementLikelihood.Log(_options.NeutralVoltageTolerance, neutral, predicted.NeutralV);
        }

        return log;
    }

    private void FillBeyond(int segment)
    {
        for (var i = 0; i < _observed.Count; i++)
        {
            _beyond[i] = _model.IsFaultBeyond(_observed[i].Point, segment);
        }
    }

    private IndicatorState Expected(int i, in FaultSolution fault)
    {
        var point = _observed[i].Point;
        if (point.Substation != fault.Substation)
        {
            return IndicatorState.None;
        }

        var beyond = _beyond[i];
        var onPath = point.OnPath(beyond);
        var phase = onPath ? fault.FaultedPhaseCurrentA : 0;
        var residual = fault.NeutralVoltageMagnitudeV * (beyond ? point.BeyondGainS : point.NotBeyondGainS);
        return point.ExpectedState(phase, residual, beyond);
    }
}
