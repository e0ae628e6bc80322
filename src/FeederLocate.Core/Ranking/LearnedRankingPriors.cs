using System.Collections.Immutable;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// Turns logged outcomes into priors for the ranking: each confirmed fault counts for its segment's
/// fault rate; each indication is compared with what the engine says the indicator should have shown
/// for a fault on the confirmed segment, and counts as a hit, a miss, a false report or a wrong direction.
/// </summary>
/// <remarks>
/// What an indicator should have shown depends on the fault type and resistance, which are unknown (on
/// isolated and resonant networks its earth element may or may not pick up). They are marginalised as the
/// ranking does: each fault type the incident allows, with its weight, over the ranking's grid of fault
/// resistances and positions, weighted by the likelihood of the incident's substation records (and the
/// tripped device) and of its indications for that fault. The indications weigh with the error rates being
/// learned, so the learning alternates (expectation–maximisation, <see cref="Iterations"/> rounds): with the
/// current rates, the posterior over the hypotheses of each incident; each indication then counts for each
/// expected state with that state's posterior probability; from those counts, new rates. An indicator that
/// reports falsely again and again is learned to do so, and then no longer pulls the fault resistance toward
/// the value that would excuse it.
/// </remarks>
public static class LearnedRankingPriors
{
    /// <summary>Rounds of expectation–maximisation: the first uses the ranking's default error rates.</summary>
    public const int Iterations = 4;

    /// <summary>
    /// Learning as the ranking uses it: prior strengths and type-level rates chosen by empirical Bayes
    /// within stated bounds, with the segments and indicators their group's prior cannot explain set apart first
    /// (<see cref="Learning.PriorChoice.DistinctMembers"/>); where there is nothing to choose from, a segment's own record outweighs its line
    /// type only after 100 km·years, and the error-rate priors equal the ranking's defaults (misreading is
    /// added by the ranking itself).
    /// </summary>
    public static LearningOptions Options { get; } = new(
        FaultRateOptions.Default with { SegmentShrinkKmYears = 100, ChooseStrengthsByData = true, SetApartDistinctSegments = true },
        IndicatorReliabilityOptions.Default with
        {
            FieldMissProbability = RankingOptions.Default.FieldRates.MissProbability,
            FieldFalseReportProbability = RankingOptions.Default.FieldRates.FalseReportProbability,
            ChooseStrengthsByData = true,
            SetApartDistinctIndicators = true,
        });

    /// <summary>
    /// Learns from the outcomes. An outcome the grid cannot explain (unknown segment or element, switch states
    /// with a loop, a confirmed segment left dead by them) is skipped and listed in <see cref="LearnedPriors.Skipped"/>.
    /// </summary>
    public static LearnedPriors Learn(NetworkGraph graph, IReadOnlyList<Outcome> outcomes, LearningOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(outcomes);
        return Learn(graph, [.. outcomes.Select(o => Observe(graph, o))], options);
    }

    /// <summary>
    /// The costly part of learning from one outcome, done once per outcome: the hypotheses on its confirmed segment
    /// with their weights from the measurements and the states each indicator should then have shown; or why the
    /// outcome cannot be learned from.
    /// </summary>
    public static ObservedIncident Observe(NetworkGraph graph, Outcome outcome)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(outcome);
        var reportedAt = outcome.Incident.ReportedAt;
        if (!graph.Grid.HasSegment(outcome.Segment))
        {
            return new ObservedIncident(outcome, null, new SkippedOutcome(reportedAt, outcome.Segment, $"segment {outcome.Segment} is not in grid {graph.Grid.Name}"));
        }

        try
        {
            return new ObservedIncident(outcome, Read(graph, outcome.Incident, outcome.Segment), null);
        }
        catch (Exception e) when (e is RankingException or KeyNotFoundException or ArgumentException)
        {
            return new ObservedIncident(outcome, null, new SkippedOutcome(reportedAt, outcome.Segment, e.Message));
        }
    }

    /// <summary>Learning from outcomes already observed (<see cref="Observe"/>), for callers that learn from many subsets of one history.</summary>
    public static LearnedPriors Learn(NetworkGraph graph, IReadOnlyList<ObservedIncident> observed, LearningOptions? options = null)
    {
        options ??= Options;
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(observed);
        var faults = new List<OutcomeSite>();
        var readings = new List<ConfirmedReading>();
        var skipped = new List<SkippedOutcome>();
        foreach (var o in observed)
        {
            if (o.Reading is { } reading)
            {
                readings.Add(reading);
                faults.Add(new OutcomeSite(o.Outcome.Segment, o.Outcome.Incident.ReportedAt));
            }
            else if (o.Skipped is { } skip)
            {
                skipped.Add(skip);
            }
        }

        var ranking = RankingOptions.Default;
        RankingPriors? rates = null;
        LearnedPriors? learned = null;
        var posteriors = new double[readings.Count][];
        for (var round = 0; round < Math.Max(1, Iterations); round++)
        {
            var observations = new List<IndicatorObservation>();
            for (var r = 0; r < readings.Count; r++)
            {
                posteriors[r] = readings[r].Posterior(graph.Grid, ranking, rates ?? RankingPriors.None);
                observations.AddRange(readings[r].Observations(posteriors[r]));
            }

            learned = HistoryLearning.Learn(graph.Grid, faults, observations, options);
            rates = ToRankingPriors(learned, hasHistory: true);
        }

        var phaseRatios = new List<double>();
        var residualRatios = new List<double>();
        for (var r = 0; r < readings.Count; r++)
        {
            readings[r].Ratios(posteriors[r], phaseRatios, residualRatios);
        }

        return learned! with
        {
            Skipped = [.. skipped],
            RecordRatios = [RecordRatio.Of(RecordRatio.PhaseCurrent, phaseRatios), RecordRatio.Of(RecordRatio.ResidualCurrent, residualRatios)],
        };
    }

    /// <summary>
    /// The largest learned P(miss) and P(wrong direction) the ranking takes: together they stay below 1, so a
    /// directional indicator showing the expected direction keeps a probability above zero.
    /// </summary>
    public const double MaximumMissProbability = 0.45;

    /// <summary>
    /// The largest learned P(false report) the ranking takes. An indicator that reports falsely more often than
    /// not is still evidence (its "no report" then says much), so the learned rate is used up to this bound,
    /// which keeps every reading's probability above zero.
    /// </summary>
    public const double MaximumFalseReportProbability = 0.95;

    /// <summary>The ranking's priors: learned fault rates for every segment; learned error rates once history exists.</summary>
    public static RankingPriors ToRankingPriors(LearnedPriors learned, bool hasHistory)
    {
        ArgumentNullException.ThrowIfNull(learned);
        var rates = learned.FaultRates.Segments.ToImmutableDictionary(s => s.Segment, s => s.FaultsPerKmYear);
        var indicators = hasHistory
            ? learned.Indicators.Indicators.ToImmutableDictionary(i => i.Indicator, i => new IndicatorErrorRates(
                Math.Min(MaximumMissProbability, i.MissProbability),
                Math.Min(MaximumFalseReportProbability, i.FalseReportProbability),
                WrongDirectionProbability: i.WrongDirectionProbability is { } w ? Math.Min(MaximumMissProbability, w) : null))
            : ImmutableDictionary<IndicatorId, IndicatorErrorRates>.Empty;
        double? Learned(string quantity) =>
            learned.RecordRatios.FirstOrDefault(r => r.Quantity == quantity) is { } ratio && double.IsFinite(ratio.RelativeError) ? ratio.RelativeError : null;
        var errors = new LearnedMeasurementErrors(Learned(RecordRatio.PhaseCurrent), Learned(RecordRatio.ResidualCurrent));
        return new RankingPriors(rates, indicators)
        {
            MeasurementErrors = errors.PhaseCurrentRelative is null && errors.ResidualCurrentRelative is null ? LearnedMeasurementErrors.None : errors,
        };
    }

    /// <summary>Learns from the outcomes and gives the ranking's priors in one step.</summary>
    public static RankingPriors From(NetworkGraph graph, IReadOnlyList<Outcome> outcomes, LearningOptions? options = null) =>
        outcomes.Count == 0 ? RankingPriors.None : ToRankingPriors(Learn(graph, outcomes, options), hasHistory: true);

    /// <summary>
    /// What each indicator the incident lists should have shown for a fault on the confirmed segment, as
    /// probabilities of the states over the fault types, resistances and positions weighted by the incident's
    /// records. Throws <see cref="RankingException"/> where the grid cannot explain the incident.
    /// </summary>
    public static IReadOnlyDictionary<IndicatorId, IReadOnlyDictionary<IndicatorState, double>> ExpectedDistributionAtConfirmed(
        NetworkGraph graph, Incident incident, SegmentId segment)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        var reading = Read(graph, incident, segment);
        return reading.ExpectedDistribution(reading.Posterior(graph.Grid, RankingOptions.Default, RankingPriors.None, withIndications: false));
    }

    /// <summary>What each indicator the incident lists should have shown for the best-fitting fault on the confirmed segment.</summary>
    public static IReadOnlyDictionary<IndicatorId, IndicatorState> ExpectedAtConfirmed(NetworkGraph graph, Incident incident, SegmentId segment)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        var computation = new RankingComputation(graph, incident with { Indications = [.. incident.Indications.Select(i => i with { Distrusted = false })] },
            RankingOptions.Default, RankingPriors.None);
        var index = graph.Grid.SegmentIndex(segment);
        if (!computation.Network.IsSegmentEnergised(index))
        {
            return new Dictionary<IndicatorId, IndicatorState>();
        }

        var best = computation.Refine(index);
        var fault = computation.Model.Solve(index, best.Position, best.Type, best.FaultResistanceOhm);
        var expected = computation.ExpectedStates(index, fault);
        return computation.Observed.Select((o, i) => (o.Indicator.Id, expected[i])).ToDictionary(p => p.Id, p => p.Item2);
    }

    private static ConfirmedReading Read(NetworkGraph graph, Incident incident, SegmentId segment)
    {
        var options = RankingOptions.Default;
        var computation = new RankingComputation(graph, incident with { Indications = [.. incident.Indications.Select(i => i with { Distrusted = false })] },
            options, RankingPriors.None);
        var index = graph.Grid.SegmentIndex(segment);
        var network = computation.Network;
        if (!network.IsSegmentEnergised(index))
        {
            throw new RankingException($"segment {segment} is not energised in the incident's switch states: the fault cannot have been there");
        }

        var substation = network.SubstationIndexOf(network.SuppliedEndOf(index));
        var plans = HypothesisPlan.For(graph.Grid.Substations[substation].Grounding.Scheme, incident, options);
        var beyond = Enumerable.Range(0, computation.Measured.Count)
            .Where(m => computation.Measured[m].Point.Substation == substation && computation.Model.IsFaultBeyond(computation.Measured[m].Point, index))
            .ToArray();
        var logWeights = new List<double>();
        var expected = new List<IndicatorState[]>();
        var predicted = new List<(double PhaseA, double ResidualA)[]>();
        var trip = computation.TripLogFactor(index);
        foreach (var plan in plans)
        {
            var logPrior = plan.LogWeight - Math.Log(plan.ResistancesOhm.Length) - Math.Log(options.Positions.Length);
            foreach (var rf in plan.ResistancesOhm)
            {
                foreach (var position in options.Positions)
                {
                    var fault = computation.Model.Solve(index, position, plan.Type, rf);
                    logWeights.Add(logPrior + trip + computation.MeasurementLogLikelihoodFast(index, fault));
                    expected.Add(computation.ExpectedStates(index, fault));
                    predicted.Add([.. beyond.Select(m =>
                    {
                        var (phase, residual, _) = computation.Predicted(computation.Measured[m], index, fault);
                        return (phase, residual);
                    })]);
                }
            }
        }

        var observed = computation.Observed
            .Select(o => (o.Indicator, Indication: incident.IndicationOf(o.Indicator.Id)!))
            .ToArray();
        var records = beyond.Select(m => computation.Measured[m].Measurement).ToArray();
        return new ConfirmedReading([.. logWeights], [.. expected], observed, records, [.. predicted]);
    }

    /// <summary>
    /// One confirmed incident compiled for learning: for each hypothesis on the confirmed segment (fault type,
    /// resistance, position) the log-weight from its prior and the records, each observed indicator's expected
    /// state, and the values predicted at the records whose device has the fault beyond it.
    /// </summary>
    internal sealed record ConfirmedReading(
        double[] LogRecordWeights,
        IndicatorState[][] Expected,
        (Indicator Indicator, Indication Indication)[] Observed,
        SubstationMeasurement[] RecordsBeyond,
        (double PhaseA, double ResidualA)[][] Predicted)
    {
        /// <summary>P(hypothesis | records and, with <paramref name="withIndications"/>, the trusted indications under the given rates).</summary>
        public double[] Posterior(Grid grid, RankingOptions options, RankingPriors rates, bool withIndications = true)
        {
            var logs = (double[])LogRecordWeights.Clone();
            if (withIndications)
            {
                for (var i = 0; i < Observed.Length; i++)
                {
                    var (indicator, indication) = Observed[i];
                    if (indication.Distrusted)
                    {
                        continue;
                    }

                    var byKind = indication.Source == IndicationSource.Field ? options.FieldRates : options.RemoteRates;
                    var own = rates.IndicatorRates.TryGetValue(indicator.Id, out var learned) ? learned with { MisreadProbability = byKind.MisreadProbability } : byKind;
                    for (var h = 0; h < logs.Length; h++)
                    {
                        logs[h] += Math.Log(IndicationLikelihood.Probability(indicator, own, Expected[h][i], indication.State));
                    }
                }
            }

            return LogMath.Normalise(logs);
        }

        /// <summary>Each indicator's expected states with their probabilities under <paramref name="posterior"/>.</summary>
        public IReadOnlyDictionary<IndicatorId, IReadOnlyDictionary<IndicatorState, double>> ExpectedDistribution(double[] posterior)
        {
            var result = new Dictionary<IndicatorId, IReadOnlyDictionary<IndicatorState, double>>();
            for (var i = 0; i < Observed.Length; i++)
            {
                var states = new Dictionary<IndicatorState, double>();
                for (var h = 0; h < posterior.Length; h++)
                {
                    if (posterior[h] > 0)
                    {
                        states[Expected[h][i]] = states.GetValueOrDefault(Expected[h][i]) + posterior[h];
                    }
                }

                result[Observed[i].Indicator.Id] = states;
            }

            return result;
        }

        /// <summary>The weighted observations: each indication against each expected state, weighted by its probability.</summary>
        public IEnumerable<IndicatorObservation> Observations(double[] posterior)
        {
            foreach (var (id, states) in ExpectedDistribution(posterior))
            {
                var indication = Observed.First(o => o.Indicator.Id == id).Indication;
                foreach (var (state, probability) in states)
                {
                    yield return new IndicatorObservation(id, state, indication.State, indication.Distrusted, probability);
                }
            }
        }

        /// <summary>Recorded / predicted at the records with the fault beyond their device, the prediction averaged under <paramref name="posterior"/>.</summary>
        public void Ratios(double[] posterior, List<double> phase, List<double> residual)
        {
            for (var m = 0; m < RecordsBeyond.Length; m++)
            {
                var (phaseA, residualA) = (0.0, 0.0);
                for (var h = 0; h < posterior.Length; h++)
                {
                    phaseA += posterior[h] * Predicted[h][m].PhaseA;
                    residualA += posterior[h] * Predicted[h][m].ResidualA;
                }

                if (RecordsBeyond[m].PhaseCurrentA is { } recordedPhase && recordedPhase > 0 && phaseA > 0)
                {
                    phase.Add(recordedPhase / phaseA);
                }

                if (RecordsBeyond[m].ResidualCurrentA is { } recordedResidual && recordedResidual > 0 && residualA > 0)
                {
                    residual.Add(recordedResidual / residualA);
                }
            }
        }
    }
}

/// <summary>One outcome prepared for learning: its compiled reading, or why it is skipped.</summary>
public sealed class ObservedIncident
{
    internal ObservedIncident(Outcome outcome, LearnedRankingPriors.ConfirmedReading? reading, SkippedOutcome? skipped)
    {
        Outcome = outcome;
        Reading = reading;
        Skipped = skipped;
    }

    public Outcome Outcome { get; }

    /// <summary>Why the outcome teaches nothing; null when it is learned from.</summary>
    public SkippedOutcome? Skipped { get; }

    internal LearnedRankingPriors.ConfirmedReading? Reading { get; }
}
