using System.Runtime.CompilerServices;
using System.Collections.Immutable;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// One ranking: every energised segment a hypothesis, its likelihood marginalised over fault type,
/// fault resistance and (for the substation measurements) position, times its prior.
/// Indications are compared at the segment's midpoint, so the cost is segments × indicators × resistances.
/// </summary>
internal sealed class RankingComputation
{
    private static readonly double[] RefinedPositions = [0.05, 0.25, 0.5, 0.75, 0.95];
    private static readonly ImmutableArray<double> MidpointOnly = [0.5];
    private readonly Grid _grid;
    private readonly Incident _incident;
    private readonly RankingOptions _options;
    private readonly RankingPriors _priors;
    private readonly NetworkGraph _graph;
    private readonly FaultResponseModel _model;
    private readonly List<ObservedIndication> _observed;
    private readonly List<MeasurementPoint> _measured;
    private readonly MeasuringPoint? _trip;
    private readonly List<IndicatorId> _leftOut = [];
    private readonly ImmutableArray<FaultTypePlan>[] _plans;
    private readonly Quadrature[][] _coarse;
    private readonly Quadrature[][] _refined;
    private readonly bool[] _beyond;
    private readonly PointsAbove _recordsAbove;
    private readonly IndicationSums _sums;
    private readonly MeasurementSums _records;
    private readonly List<int> _recordsBeyond = [];
    private readonly ProtectionEvidence _protection;
    private readonly double[] _segmentZ1MagnitudeOhm;
    private readonly double[] _segmentEarthLoopOhm;
    private readonly (double Min, double Max) _fromSupplyRange;
    private readonly double[] _logPriors;

    public RankingComputation(NetworkGraph graph, Incident incident, RankingOptions options, RankingPriors priors)
    {
        _graph = graph;
        _grid = graph.Grid;
        _incident = incident;
        _options = options;
        _priors = priors;
        if (!graph.TryEnergise(SwitchStates.AtFaultTime(_grid, incident), out var network, out var problem))
        {
            throw new RankingException(NoRadialNetwork(problem));
        }

        Network = network;
        _model = new FaultResponseModel(Network, options.VoltageFactor);
        _observed = EvidencePoints.Indications(_grid, incident, _model, options, priors, _leftOut, Expired);
        _measured = EvidencePoints.Measurements(_grid, incident, _model);
        _trip = incident.TrippedDevice is { } tripped ? _model.SwitchPoint(_grid.SwitchIndex(tripped)) : null;
        _plans = [.. _grid.Substations.Select(s => HypothesisPlan.For(s.Grounding.Scheme, incident, options))];
        _coarse = [.. _plans.Select(plans => plans.Select(Quadrature.Coarse).ToArray())];
        _refined = [.. _plans.Select(plans => plans.Select(Quadrature.Refined).ToArray())];
        _beyond = new bool[_observed.Count];
        _recordsAbove = new PointsAbove(Network, [.. _measured.Select(m => m.Point)]);
        _sums = new IndicationSums(_model, _observed, options.PickupTolerance);
        _records = new MeasurementSums(this, _measured, _model);
        _protection = new ProtectionEvidence(_model, incident, options);
        // |Z1| and the earth-fault loop |(2·Z1 + Z0) / 3| of each segment, for the drop along it.
        var z1 = _grid.Segments.Select(x => new System.Numerics.Complex(_grid.LineTypeOf(x).R1OhmPerKm, _grid.LineTypeOf(x).X1OhmPerKm) * x.LengthKm).ToArray();
        var z0 = _grid.Segments.Select(x => new System.Numerics.Complex(_grid.LineTypeOf(x).R0OhmPerKm, _grid.LineTypeOf(x).X0OhmPerKm) * x.LengthKm).ToArray();
        _segmentZ1MagnitudeOhm = [.. z1.Select(z => z.Magnitude)];
        _segmentEarthLoopOhm = [.. z1.Select((z, s) => (((2 * z) + z0[s]) / 3).Magnitude)];
        // The first pass compares the midpoint and the option's positions, from either end.
        double[] shares = [0.5, .. options.Positions, .. options.Positions.Select(p => 1 - p)];
        _fromSupplyRange = (shares.Min(), shares.Max());
        _logPriors = PriorLogs.Of(priors, _grid);
    }

    public EnergisedNetwork Network { get; }

    internal const string NothingEnergised = "no segment is energised in the incident's switch states: nothing to rank";

    internal static string NoRadialNetwork(TopologyProblem problem) => $"the incident's switch states give no radial network: {problem}";

    internal FaultResponseModel Model => _model;

    internal IReadOnlyList<ObservedIndication> Observed => _observed;

    internal IReadOnlyList<MeasurementPoint> Measured => _measured;

    internal IReadOnlyList<IndicatorId> LeftOut => _leftOut;

    /// <summary>Indicators whose reading is older than their reset time after the fault: they carry no weight.</summary>
    internal List<IndicatorId> Expired { get; } = [];

    internal Incident Incident => _incident;

    internal RankingOptions Options => _options;

    internal RankingPriors Priors => _priors;

    internal NetworkGraph Graph => _graph;

    /// <summary>
    /// Scores every energised segment, by branch and bound: a cheap upper bound of each segment's likelihood
    /// first (<see cref="UpperBound"/>), then the segments in order of bound times prior, each scored in full
    /// unless its bound shows it cannot matter. A segment is passed over only where its bound times prior lies
    /// more than <see cref="PrunedBelowNats"/> + ln(segments) below the best posterior found, below the
    /// <see cref="KeptLeaders"/>th best found, and its bound below the third-best likelihood found: so every
    /// segment passed over has at most e^-30 of the best's posterior (all of them together too), and the
    /// leaders by posterior and by likelihood are the same as if every segment were scored. Segments that hold
    /// an indicator that picked up are always scored (the cross-country pairs start from them). A segment
    /// passed over gets probability 0 (it had less than e^-30 of the best's).
    /// This and the loops it calls are compiled fully optimised at once (AggressiveOptimization): each runs
    /// once per ranking, too few calls for tiered compilation to optimise them before the first few dozen
    /// rankings after a start.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public List<SegmentScore> ScoreSegments()
    {
        var energised = new List<int>();
        for (var s = 0; s < _grid.Segments.Length; s++)
        {
            if (Network.IsSegmentEnergised(s))
            {
                energised.Add(s);
            }
        }

        if (energised.Count == 0)
        {
            throw new RankingException(NothingEnergised);
        }

        var scored = new SegmentScore?[_grid.Segments.Length];
        if (Exhaustive || energised.Count <= KeptLeaders)
        {
            foreach (var s in energised)
            {
                scored[s] = Score(s);
            }
        }
        else
        {
            ScoreByBranchAndBound(energised, scored);
        }

        return [.. energised.Select(s => scored[s]!)];
    }

    /// <summary>Score every segment in full, without passing over any (what the tests compare the pruned ranking with).</summary>
    internal bool Exhaustive { get; init; }

    /// <summary>How many segments passed over so far in this computation (for the tests).</summary>
    internal int PassedOver { get; private set; }

    /// <summary>A segment is passed over only where its bound lies this far, plus ln(segments), below the best posterior: 30 nats (e^-30 ≈ 1e-13).</summary>
    internal const double PrunedBelowNats = 30;

    /// <summary>The leaders by posterior kept exactly, at least: as many as the cross-country pairs start from and as many as are explained.</summary>
    private int KeptLeaders => Math.Max(3, Math.Max(_options.CrossCountryCandidates, _options.ExplainedSuspects));

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void ScoreByBranchAndBound(List<int> energised, SegmentScore?[] scored)
    {
        var alwaysScored = new HashSet<int>(_observed
            .Where(o => o.Indication.State is not IndicatorState.None)
            .Select(o => _grid.SegmentIndex(o.Indicator.Segment)));
        var bounds = new (int Segment, double Bound, double LogPrior)[energised.Count];
        for (var k = 0; k < energised.Count; k++)
        {
            var s = energised[k];
            bounds[k] = (s, UpperBound(s), LogPrior(s));
        }

        Array.Sort(bounds, (a, b) => (b.Bound + b.LogPrior).CompareTo(a.Bound + a.LogPrior));
        var margin = PrunedBelowNats + Math.Log(energised.Count);
        var bestPosterior = double.NegativeInfinity;
        var leaders = new PriorityQueue<double, double>();
        var likelihoods = new PriorityQueue<double, double>();
        foreach (var (s, bound, logPrior) in bounds)
        {
            var kthPosterior = leaders.Count < KeptLeaders ? double.PositiveInfinity : leaders.Peek();
            var thirdLikelihood = likelihoods.Count < 3 ? double.PositiveInfinity : likelihoods.Peek();
            if (!alwaysScored.Contains(s) && bound + logPrior < bestPosterior - margin && bound + logPrior < kthPosterior && bound < thirdLikelihood)
            {
                scored[s] = new SegmentScore(s, logPrior, double.NegativeInfinity, new BestHypothesis(FaultType.LG, 0, 0.5, double.NegativeInfinity), []);
                PassedOver++;
                continue;
            }

            var score = Score(s);
            scored[s] = score;
            bestPosterior = Math.Max(bestPosterior, score.LogPosterior);
            Keep(leaders, score.LogPosterior, KeptLeaders);
            Keep(likelihoods, score.Best.LogLikelihood, 3);
        }
    }

    /// <summary>Keeps the <paramref name="count"/> largest values seen, the least of them first.</summary>
    private static void Keep(PriorityQueue<double, double> largest, double value, int count)
    {
        if (largest.Count < count)
        {
            largest.Enqueue(value, value);
        }
        else if (value > largest.Peek())
        {
            largest.DequeueEnqueue(value, value);
        }
    }

    /// <summary>
    /// An upper bound of the segment's likelihood over every hypothesis the first pass scores: the trip factor,
    /// and for each fault type its protection factor (the intact fuses' factor is at most 1) plus the bounds of
    /// the indications and of the records over the |U0| the type's resistances and the compared positions can
    /// give (<see cref="FaultResponseModel.NeutralVoltageRangeV"/>), whatever the phase current. The prior
    /// weights of the types and resistances sum to 1, so the marginal likelihood and the best hypothesis lie
    /// below it too.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal double UpperBound(int segment)
    {
        var up = Network.SuppliedEndOf(segment);
        var sub = Network.SubstationIndexOf(up);
        _recordsBeyond.Clear();
        _recordsAbove.Collect(up, _recordsBeyond);

        var plans = _plans[sub];
        var best = double.NegativeInfinity;
        for (var t = 0; t < plans.Length; t++)
        {
            var plan = plans[t];
            var quadrature = _coarse[sub][t];
            var (u0Min, u0Max) = _model.NeutralVoltageRangeV(segment, plan.Type, _fromSupplyRange.Min, _fromSupplyRange.Max, quadrature.LeastOhm, quadrature.MostOhm);
            var log = _protection.TypeLog(segment, plan.Type, sub)
                + _sums.UpperBound(segment, sub, up, u0Min, u0Max)
                + (_measured.Count == 0 ? 0 : _records.UpperBound(sub, u0Min, u0Max, _recordsBeyond));
            best = Math.Max(best, log);
        }

        return TripLogFactor(segment) + best;
    }

    private double LogPrior(int segment) => _logPriors[segment];

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
            var protection = _protection.TypeLog(segment, plan.Type, sub);
            foreach (var rf in FineResistances(plan.ResistancesOhm))
            {
                foreach (var position in RefinedPositions)
                {
                    // The shortcut sums, equal to the plain ones (see the tests), at every point of the finer grid.
                    var fault = _model.Solve(segment, position, plan.Type, rf);
                    var log = _sums.LogLikelihood(segment, fault) + _records.LogLikelihood(fault, beyond) + trip
                        + protection + (_protection.HasResistanceTerms ? _protection.FaultLog(segment, fault, rf) : 0);
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

    /// <summary>
    /// Σ log P(record | fault) over the observed indications, indicator by indicator (the slow, plain sum):
    /// each element picks up on the <see cref="PickupCurve"/> of the current it sees.
    /// </summary>
    public double IndicationLogLikelihoodDirect(int segment, in FaultSolution fault)
    {
        FillBeyond(segment);
        var total = 0.0;
        for (var i = 0; i < _observed.Count; i++)
        {
            var o = _observed[i];
            var point = o.Point;
            if (point.Substation != fault.Substation)
            {
                total += o.LogProbability(IndicatorState.None);
                continue;
            }

            var beyond = _beyond[i];
            var onPath = point.OnPath(beyond);
            var residual = fault.NeutralVoltageMagnitudeV * (beyond ? point.BeyondGainS : point.NotBeyondGainS);
            total += o.LogProbability(beyond, onPath, onPath ? fault.FaultedPhaseCurrentA : 0, residual, _options.PickupTolerance);
        }

        return total;
    }

    /// <summary>Σ log-likelihood of the substation measurements, record by record (the slow, plain sum).</summary>
    public double MeasurementLogLikelihoodDirect(int segment, in FaultSolution fault)
    {
        var total = 0.0;
        foreach (var record in _measured)
        {
            total += MeasurementLogLikelihood(record.Measurement, Predicted(record, segment, fault));
        }

        return total;
    }

    /// <summary>The same plain sum with the records' devices that have the segment beyond them given (<see cref="RecordsBeyond"/>): the same arithmetic, for many faults on one segment.</summary>
    internal double MeasurementLogLikelihoodDirect(in FaultSolution fault, bool[] beyond)
    {
        var total = 0.0;
        for (var m = 0; m < _measured.Count; m++)
        {
            var point = _measured[m].Point;
            var same = point.Substation >= 0 && point.Substation == fault.Substation;
            total += MeasurementLogLikelihood(_measured[m].Measurement, Predicted(point, same, same && beyond[m], fault));
        }

        return total;
    }

    /// <summary>Which records' devices have a fault on the segment beyond them.</summary>
    internal bool[] RecordsBeyond(int segment) => [.. _measured.Select(r => _model.IsFaultBeyond(r.Point, segment))];

    /// <summary>The value a record's device would have measured for a solved fault, with whether its device has the fault beyond it given.</summary>
    internal (double PhaseA, double ResidualA, double NeutralV) Predicted(int record, bool beyond, in FaultSolution fault)
    {
        var point = _measured[record].Point;
        var same = point.Substation >= 0 && point.Substation == fault.Substation;
        return Predicted(point, same, same && beyond, fault);
    }

    /// <summary>The same sum through the tabulated shortcut the ranking uses.</summary>
    public double MeasurementLogLikelihoodFast(int segment, in FaultSolution fault)
    {
        var sub = fault.Substation;
        var beyond = Enumerable.Range(0, _measured.Count)
            .Where(m => _measured[m].Point.Substation == sub && _model.IsFaultBeyond(_measured[m].Point, segment)).ToList();
        return _records.LogLikelihood(fault, beyond);
    }

    /// <summary>The same sum through the sorted-threshold shortcut the ranking uses.</summary>
    public double IndicationLogLikelihood(int segment, in FaultSolution fault) => _sums.LogLikelihood(segment, fault);

    /// <summary>The value a record's device would have measured for a solved fault.</summary>
    public (double PhaseA, double ResidualA, double NeutralV) Predicted(MeasurementPoint record, int segment, in FaultSolution fault)
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

    /// <summary>
    /// The scores again, for the segments whose coarse posterior lies within <see cref="RefinedWithinNats"/>
    /// of the best (the <see cref="MaximumRefined"/> best of them), on a finer quadrature: each fault resistance's share of the prior spread over four points
    /// of its cell, and more positions along the segment. Sharp evidence (many exact records) can fall
    /// between the coarse grid's points; refining only the contenders keeps the cost small.
    /// </summary>
    public List<SegmentScore> RefineContenders(List<SegmentScore> scores)
    {
        var best = scores.Max(x => x.LogPosterior);
        var contenders = scores.Where(x => x.LogPosterior >= best - RefinedWithinNats)
            .OrderByDescending(x => x.LogPosterior).Take(MaximumRefined).Select(x => x.Segment).ToHashSet();
        return [.. scores.Select(x => contenders.Contains(x.Segment) ? Score(x.Segment, refined: true) : x)];
    }

    /// <summary>At most this many contenders are refined (the cost stays bounded where many segments tie).</summary>
    private const int MaximumRefined = 30;

    /// <summary>How far below the best coarse posterior a segment is still refined, in nats (e^-20 ≈ 2e-9).</summary>
    private const double RefinedWithinNats = 20;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private SegmentScore Score(int segment, bool refined = false)
    {
        var sub = Network.SubstationIndexOf(Network.SuppliedEndOf(segment));
        _recordsBeyond.Clear();
        _recordsAbove.Collect(Network.SuppliedEndOf(segment), _recordsBeyond);

        var tripLog = TripLogFactor(segment);
        if (refined)
        {
            return ScoreRefined(segment, sub, tripLog);
        }

        var marginal = double.NegativeInfinity;
        var best = new BestHypothesis(FaultType.LG, 0, 0.5, double.NegativeInfinity);
        var plans = _plans[sub];
        var byType = new Dictionary<FaultType, double>(plans.Length);
        var quadratures = refined ? _refined[sub] : _coarse[sub];
        for (var t = 0; t < plans.Length; t++)
        {
            var plan = plans[t];
            var quadrature = quadratures[t];
            var protection = _protection.TypeLog(segment, plan.Type, sub);
            var typeMarginal = double.NegativeInfinity;
            for (var q = 0; q < quadrature.ResistancesOhm.Length; q++)
            {
                var rf = quadrature.ResistancesOhm[q];
                var logWeight = quadrature.LogWeights[q];
                var mid = _model.Solve(segment, 0.5, plan.Type, rf);
                var (evidence, position) = AlongSegment(segment, plan.Type, rf, mid, refined);
                var likelihood = evidence + protection
                    + (_protection.HasResistanceTerms ? _protection.FaultLog(segment, mid, rf) : 0);
                typeMarginal = LogMath.Add(typeMarginal, logWeight + likelihood);
                if (likelihood + tripLog > best.LogLikelihood)
                {
                    best = new BestHypothesis(plan.Type, rf, position, likelihood + tripLog);
                }
            }

            byType[plan.Type] = tripLog + typeMarginal;
            marginal = LogMath.Add(marginal, typeMarginal);
        }

        return new SegmentScore(segment, LogPrior(segment), tripLog + marginal, best, byType);
    }

    /// <summary>
    /// A contender's score on the finer quadrature: every fault type and resistance first at evenly spaced
    /// positions, then, for those within <see cref="PositionCells.PeakWindowNats"/> of the segment's best,
    /// more positions where the likelihood still changes sharply along the segment (see <see cref="PositionCells"/>).
    /// </summary>
    private SegmentScore ScoreRefined(int segment, int sub, double tripLog)
    {
        var plans = _plans[sub];
        var quadratures = _refined[sub];
        var series = new List<(int Plan, double ResistanceOhm, double LogWeight, double Other, PositionCells Cells, bool Along)>();
        for (var t = 0; t < plans.Length; t++)
        {
            var plan = plans[t];
            var protection = _protection.TypeLog(segment, plan.Type, sub);
            for (var q = 0; q < quadratures[t].ResistancesOhm.Length; q++)
            {
                var rf = quadratures[t].ResistancesOhm[q];
                var mid = _model.Solve(segment, 0.5, plan.Type, rf);
                var other = protection + (_protection.HasResistanceTerms ? _protection.FaultLog(segment, mid, rf) : 0);
                var positions = PositionsFor(segment, plan.Type, mid, refined: true);
                var cells = PositionCells.At(positions, EvidenceAt(segment, plan.Type, rf, mid));
                series.Add((t, rf, quadratures[t].LogWeights[q], other, cells, positions.Length > 1));
            }
        }

        var bestLog = series.Max(x => x.Cells.MaximumLog + x.Other);
        foreach (var x in series.Where(x => x.Along && x.Cells.MaximumLog + x.Other >= bestLog - PositionCells.PeakWindowNats))
        {
            x.Cells.Refine(EvidenceAt(segment, plans[x.Plan].Type, x.ResistanceOhm, _model.Solve(segment, 0.5, plans[x.Plan].Type, x.ResistanceOhm)), bestLog - PositionCells.PeakWindowNats - x.Other);
        }

        var marginal = double.NegativeInfinity;
        var best = new BestHypothesis(FaultType.LG, 0, 0.5, double.NegativeInfinity);
        var byType = new Dictionary<FaultType, double>(plans.Length);
        for (var t = 0; t < plans.Length; t++)
        {
            var typeMarginal = double.NegativeInfinity;
            foreach (var x in series.Where(x => x.Plan == t))
            {
                var likelihood = x.Cells.LogMean + x.Other;
                typeMarginal = LogMath.Add(typeMarginal, x.LogWeight + likelihood);
                if (likelihood + tripLog > best.LogLikelihood)
                {
                    best = new BestHypothesis(plans[t].Type, x.ResistanceOhm, x.Along ? x.Cells.BestPosition : 0.5, likelihood + tripLog);
                }
            }

            byType[plans[t].Type] = tripLog + typeMarginal;
            marginal = LogMath.Add(marginal, typeMarginal);
        }

        return new SegmentScore(segment, LogPrior(segment), tripLog + marginal, best, byType);
    }

    /// <summary>The indications' and records' joint log-likelihood of a fault at a position of the segment (the midpoint's solution reused).</summary>
    private Func<double, double> EvidenceAt(int segment, FaultType type, double rf, FaultSolution mid) => position =>
    {
        var fault = position == 0.5 ? mid : _model.Solve(segment, position, type, rf);
        return _sums.LogLikelihood(segment, fault) + RecordsAt(fault);
    };

    /// <summary>
    /// The fault resistances of one plan with their log weights, the type's prior weight included: the
    /// plan's own grid, or (refined) each grid resistance's prior weight spread evenly over four points of
    /// its cell (from halfway to the previous point to halfway to the next, halfway taken on a log scale
    /// except next to 0 Ω). Built once per ranking, not once per segment.
    /// </summary>
    private sealed record Quadrature(double[] ResistancesOhm, double[] LogWeights)
    {
        public double LeastOhm { get; } = ResistancesOhm.Min();

        public double MostOhm { get; } = ResistancesOhm.Max();

        public static Quadrature Coarse(FaultTypePlan plan) =>
            new([.. plan.ResistancesOhm], [.. plan.ResistanceLogWeights.Select(w => plan.LogWeight + w)]);

        public static Quadrature Refined(FaultTypePlan plan)
        {
            var r = plan.ResistancesOhm;
            var values = new List<double>();
            var weights = new List<double>();
            double Boundary(int k) => r[k] <= 0 ? r[k + 1] / 2 : Math.Sqrt(r[k] * r[k + 1]);
            for (var k = 0; k < r.Length; k++)
            {
                var lo = k == 0 ? r[0] : Boundary(k - 1);
                var hi = k == r.Length - 1 ? r[k] : Boundary(k);
                var logWeight = plan.ResistanceLogWeights[k] - Math.Log(4);
                for (var j = 0; j < 4; j++)
                {
                    var f = (j + 0.5) / 4;
                    values.Add(lo <= 0 ? (j == 0 ? 0 : hi * j / 3.0) : lo * Math.Pow(hi / lo, f));
                    weights.Add(plan.LogWeight + logWeight);
                }
            }

            return new([.. values], [.. weights]);
        }
    }

    /// <summary>
    /// The indications' and records' joint likelihood averaged over positions along the segment, and the
    /// best-fitting position. Where the fault current's drop along the segment is small against the phase
    /// voltage (most earth faults on isolated and resonant networks, high-resistance ones everywhere) nothing
    /// the evidence shows changes along it and the midpoint stands for it; otherwise more positions the
    /// larger the drop (the finer check of the best explanation still uses its own positions).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private (double LogLikelihood, double BestPosition) AlongSegment(int segment, FaultType type, double rf, in FaultSolution mid, bool refined)
    {
        var positions = PositionsFor(segment, type, mid, refined);
        if (positions.Length == 1)
        {
            return (_sums.LogLikelihood(segment, mid) + RecordsAt(mid), 0.5);
        }

        var total = double.NegativeInfinity;
        var best = (Log: double.NegativeInfinity, Position: 0.5);
        foreach (var position in positions)
        {
            var fault = position == 0.5 ? mid : _model.Solve(segment, position, type, rf);
            var log = _sums.LogLikelihood(segment, fault) + RecordsAt(fault);
            total = LogMath.Add(total, log);
            if (log > best.Log)
            {
                best = (log, position);
            }
        }

        return (total - Math.Log(positions.Length), best.Position);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private double RecordsAt(in FaultSolution fault) => _measured.Count == 0 ? 0 : _records.LogLikelihood(fault, _recordsBeyond);

    /// <summary>
    /// Positions at which to compare the evidence: the midpoint where the drop of the fault current along the
    /// whole segment is under <see cref="FlatDropShare"/> of the phase voltage; else the option's positions,
    /// and in the refined pass evenly spaced ones, one per <see cref="FlatDropShare"/>·2 of drop, up to
    /// <see cref="MaximumPositions"/> (cut finer near a sharp peak by <see cref="PositionCells"/>).
    /// </summary>
    private ImmutableArray<double> PositionsFor(int segment, FaultType type, in FaultSolution mid, bool refined)
    {
        var loopOhm = type is FaultType.LG or FaultType.LLG ? _segmentEarthLoopOhm[segment] : _segmentZ1MagnitudeOhm[segment];
        var dropShare = mid.FaultedPhaseCurrentA * loopOhm / mid.PhaseVoltageV;
        if (dropShare < FlatDropShare)
        {
            return MidpointOnly;
        }

        // The coarse pass keeps to the option's positions; the refined one takes more where the drop is larger.
        var count = Math.Min(MaximumPositions, (int)Math.Ceiling(dropShare / (2 * FlatDropShare)));
        if (!refined || count <= _options.Positions.Length)
        {
            return _options.Positions;
        }

        return [.. Enumerable.Range(0, count).Select(k => (k + 0.5) / count)];
    }

    /// <summary>Share of the phase voltage under which the fault current's drop along a segment changes nothing the evidence shows: 1 %.</summary>
    private const double FlatDropShare = 0.01;

    private const int MaximumPositions = 5;

    internal double MeasurementLogLikelihood(SubstationMeasurement m, (double PhaseA, double ResidualA, double NeutralV) predicted)
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
