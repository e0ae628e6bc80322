using System.Collections.Immutable;
using System.Globalization;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// Entry point of the ranking: the posterior probability of the fault lying on each energised segment
/// (and so in each section), from the indications and substation records of an incident, with the
/// reference fault model predicting what each would show for a fault anywhere.
/// </summary>
public static class FaultRanking
{
    /// <summary>Ranks an incident; throws <see cref="RankingException"/> where it cannot be ranked.</summary>
    public static RankingResult Rank(Grid grid, Incident incident, RankingOptions? options = null, RankingPriors? priors = null) =>
        Rank(new NetworkGraph(grid), incident, options, priors);

    /// <summary>Ranks an incident on a prepared network graph (reuse it across incidents of one grid).</summary>
    public static RankingResult Rank(NetworkGraph graph, Incident incident, RankingOptions? options = null, RankingPriors? priors = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        options ??= RankingOptions.Default;
        options.Validate();
        priors ??= RankingPriors.None;
        options = priors.WidenTolerances(options);
        var computation = new RankingComputation(graph, incident, options, priors);
        var scores = computation.ScoreSegments();
        return Assemble(computation, scores);
    }

    /// <summary>Ranks an incident, or says why it cannot.</summary>
    public static bool TryRank(Grid grid, Incident incident, out RankingResult? result, out string? problem, RankingOptions? options = null, RankingPriors? priors = null)
    {
        try
        {
            result = Rank(grid, incident, options, priors);
            problem = null;
            return true;
        }
        catch (RankingException e)
        {
            result = null;
            problem = e.Message;
            return false;
        }
    }

    private static RankingResult Assemble(RankingComputation computation, List<SegmentScore> scores)
    {
        var grid = computation.Model.Grid;
        var sections = computation.Graph.Sections;
        var options = computation.Options;
        var distances = new DistanceCalculator(computation.Network);

        // Consistency is judged on the single hypothesis that explains the evidence best; where the coarse
        // grid finds none, the few best segments are refined on a finer grid before the verdict.
        var best = scores.MaxBy(s => s.Best.LogLikelihood)!;
        var (bestChecks, consistent) = Judge(computation, best, distances, refined: false);
        if (!consistent)
        {
            best = scores.OrderByDescending(s => s.Best.LogLikelihood).Take(3)
                .Select(s => s with { Best = computation.Refine(s.Segment) })
                .MaxBy(s => s.Best.LogLikelihood)!;
            (bestChecks, consistent) = Judge(computation, best, distances, refined: true);
        }

        var singleLogs = scores.Select(s => s.LogPosterior).ToList();
        var crossCountry = ImmutableArray<CrossCountrySuspect>.Empty;
        var segmentProbability = new Dictionary<int, double>();
        double[] probabilities;
        if (!consistent && CrossCountryRanking.Applies(computation, best))
        {
            var outcome = CrossCountryRanking.Rank(computation, scores, options);
            probabilities = [.. outcome.SingleProbabilities];
            crossCountry = outcome.Pairs;
            consistent = outcome.Consistent;
            foreach (var (segment, share) in outcome.SegmentShares)
            {
                segmentProbability[segment] = share;
            }
        }
        else
        {
            probabilities = LogMath.Normalise(singleLogs);
        }

        for (var k = 0; k < scores.Count; k++)
        {
            segmentProbability[scores[k].Segment] = segmentProbability.GetValueOrDefault(scores[k].Segment) + probabilities[k];
        }

        var rankedSegments = segmentProbability
            .Select(p => new RankedSegment(grid.Segments[p.Key].Id, sections.OfSegment(p.Key).Id, p.Value))
            .OrderByDescending(s => s.Probability).ThenBy(s => s.Id.Value, StringComparer.Ordinal)
            .ToImmutableArray();
        var rankedSections = rankedSegments
            .GroupBy(s => s.Section)
            .Select(g => new RankedSection(g.Key, sections[g.Key].Segments, g.Sum(s => s.Probability)))
            .OrderByDescending(s => s.Probability).ThenBy(s => s.Id.Value, StringComparer.Ordinal)
            .ToImmutableArray();

        var scoreOf = scores.ToDictionary(s => grid.Segments[s.Segment].Id);
        var explanations = rankedSegments.Take(options.ExplainedSuspects)
            .Where(s => scoreOf.ContainsKey(s.Id))
            .Select(s => SuspectExplainer.Explain(computation, scoreOf[s.Id], s.Probability, distances))
            .ToImmutableArray();

        return new RankingResult(
            consistent,
            rankedSegments,
            rankedSections,
            explanations,
            consistent ? [] : [.. bestChecks.Where(c => !c.Agrees)],
            crossCountry,
            [.. computation.LeftOut],
            FaultTypeProbabilities(scores),
            Assumptions(computation));
    }

    private static (ImmutableArray<IndicationCheck> Checks, bool Consistent) Judge(RankingComputation computation, SegmentScore best, DistanceCalculator distances, bool refined)
    {
        var checks = SuspectExplainer.Checks(computation, best.Segment, best.Best, refined ? best.Best.Position : 0.5);
        var explanation = SuspectExplainer.Explain(computation, best, 0, distances, refined, withWindow: false);
        var consistent = ConsistencyCheck.Explains(checks, explanation.Measurements, computation.TripLogFactor(best.Segment) == 0, computation.Options);
        return (checks, consistent);
    }

    private static ImmutableDictionary<FaultType, double> FaultTypeProbabilities(List<SegmentScore> scores)
    {
        var types = scores.SelectMany(s => s.LogByType.Keys).Distinct().ToList();
        var logs = types.Select(t => scores.Aggregate(double.NegativeInfinity, (sum, s) =>
            s.LogByType.TryGetValue(t, out var l) ? LogMath.Add(sum, s.LogPrior + l) : sum)).ToList();
        var p = LogMath.Normalise(logs);
        return types.Select((t, i) => (t, p[i])).ToImmutableDictionary(x => x.t, x => x.Item2);
    }

    private static ImmutableArray<string> Assumptions(RankingComputation computation)
    {
        var o = computation.Options;
        static string Pct(double p) => (p * 100).ToString("0.#", CultureInfo.InvariantCulture) + " %";
        static string Ohms(ImmutableArray<double> r) => string.Join(", ", r.Select(x => x.ToString(CultureInfo.InvariantCulture))) + " Ω";
        var list = new List<string>
        {
            $"indicator error rates: remote miss {Pct(o.RemoteRates.MissProbability)}, false {Pct(o.RemoteRates.FalseReportProbability)}; field-read miss {Pct(o.FieldRates.MissProbability)}, false {Pct(o.FieldRates.FalseReportProbability)}, misread {Pct(o.FieldRates.MisreadProbability)} (learned rates replace them where history exists)",
            $"stale indications (read after the indicator's reset time or before a trial re-energisation) weigh {Pct(o.StaleWeight)}",
            $"fault resistance marginalised over: earth faults on isolated and resonant networks {Ohms(o.HighResistanceEarthFaultOhms)}; on solid and impedance networks {Ohms(o.LowResistanceEarthFaultOhms)}; short circuits {Ohms(o.ShortCircuitOhms)}",
            $"measurement tolerance{(computation.Priors.MeasurementErrors == LearnedMeasurementErrors.None ? string.Empty : " (widened to the error learned from outcomes where larger)")}: phase current {Pct(o.PhaseCurrentTolerance.Relative)} + {o.PhaseCurrentTolerance.Absolute.ToString(CultureInfo.InvariantCulture)} A, residual current {Pct(o.ResidualCurrentTolerance.Relative)} + {o.ResidualCurrentTolerance.Absolute.ToString(CultureInfo.InvariantCulture)} A, neutral voltage {Pct(o.NeutralVoltageTolerance.Relative)} + {o.NeutralVoltageTolerance.Absolute.ToString(CultureInfo.InvariantCulture)} V",
            "indications are compared with a fault at each segment's midpoint; substation records at several positions along it",
            "load current is ignored in the fault currents (reference model); Z2 = Z1",
        };
        if (computation.Incident.TrippedDevice is { } tripped)
        {
            list.Add($"the fault lies where {tripped} would have seen it; elsewhere a factor {o.OutsideTrippedZoneFactor.ToString(CultureInfo.InvariantCulture)} (maloperation or a wrong switch state)");
        }

        if (computation.LeftOut.Count > 0)
        {
            list.Add($"left out as suspect by the operator: {string.Join(", ", computation.LeftOut)}");
        }

        return [.. list];
    }
}
