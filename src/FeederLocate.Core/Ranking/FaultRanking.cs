using System.Diagnostics.CodeAnalysis;
using System.Collections.Immutable;
using System.Globalization;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// Entry point of the ranking: the posterior probability of the fault lying on each energised segment
/// (and so in each section), from the indications and substation measurements of an incident, with the
/// reference fault model predicting what each would show for a fault anywhere.
/// </summary>
public static class FaultRanking
{
    /// <summary>Ranks an incident; throws <see cref="RankingException"/> where it cannot be ranked.</summary>
    public static RankingResult Rank(Grid grid, Incident incident, RankingOptions? options = null, RankingPriors? priors = null) =>
        Rank(new NetworkGraph(grid), incident, options, priors);

    /// <summary>Ranks an incident on a prepared network graph (reuse it across incidents of one grid).</summary>
    public static RankingResult Rank(NetworkGraph graph, Incident incident, RankingOptions? options = null, RankingPriors? priors = null) =>
        Rank(graph, incident, options, priors, exhaustive: false);

    /// <summary>As <see cref="Rank(NetworkGraph, Incident, RankingOptions?, RankingPriors?)"/>; <paramref name="exhaustive"/> scores every segment in full, passing over none (for the tests).</summary>
    internal static RankingResult Rank(NetworkGraph graph, Incident incident, RankingOptions? options, RankingPriors? priors, bool exhaustive)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        options ??= RankingOptions.Default;
        options.Validate();
        priors ??= RankingPriors.None;
        options = priors.WidenTolerances(options);
        var computation = new RankingComputation(graph, incident, options, priors) { Exhaustive = exhaustive };
        var scores = computation.RefineContenders(computation.ScoreSegments());
        return Assemble(computation, scores);
    }

    /// <summary>
    /// Ranks an incident, or says why it cannot: switch states that give no radial network, or nothing
    /// energised. Such evidence is a refusal, never an exception.
    /// </summary>
    public static bool TryRank(Grid grid, Incident incident, [NotNullWhen(true)] out RankingResult? result, [NotNullWhen(false)] out string? problem, RankingOptions? options = null, RankingPriors? priors = null)
    {
        ArgumentNullException.ThrowIfNull(grid);
        return TryRank(new NetworkGraph(grid), incident, out result, out problem, options, priors);
    }

    /// <summary>As <see cref="TryRank(Grid, Incident, out RankingResult?, out string?, RankingOptions?, RankingPriors?)"/> on a prepared graph.</summary>
    public static bool TryRank(NetworkGraph graph, Incident incident, [NotNullWhen(true)] out RankingResult? result, [NotNullWhen(false)] out string? problem, RankingOptions? options = null, RankingPriors? priors = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        problem = Refusal(graph, incident);
        if (problem is not null)
        {
            result = null;
            return false;
        }

        result = Rank(graph, incident, options, priors);
        return true;
    }

    /// <summary>Why <paramref name="incident"/> cannot be ranked on <paramref name="graph"/>; null when it can.</summary>
    public static string? Refusal(NetworkGraph graph, Incident incident)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        if (!graph.TryEnergise(SwitchStates.AtFaultTime(graph.Grid, incident), out var network, out var topology))
        {
            return RankingComputation.NoRadialNetwork(topology);
        }

        for (var s = 0; s < graph.Grid.Segments.Length; s++)
        {
            if (network.IsSegmentEnergised(s))
            {
                return null;
            }
        }

        return RankingComputation.NothingEnergised;
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

        // Wrongly recorded switch positions. The probabilities reported below stay those of the recorded
        // positions, on purpose: the explanations, the distance windows and the switching plan all rest on
        // one topology, and a mixture would put weight on sections the plan's network holds dead or on a
        // 1 %-prior hypothesis the operator has not confirmed. The suspects are reported beside them, each
        // with where the fault most probably lies if it is so; confirming the real position ranks again.
        // The evidence counts as unexplained when the other positions together are the more probable.
        var switchSuspects = SwitchSuspicion.Find(computation, scores);
        var explainedByRecorded = switchSuspects.Sum(s => s.Probability) < 0.5;

        var singleLogs = new double[scores.Count];
        for (var k = 0; k < scores.Count; k++)
        {
            singleLogs[k] = scores[k].LogPosterior;
        }

        var crossCountry = ImmutableArray<CrossCountrySuspect>.Empty;
        // Each segment's probability by index, NaN where it has none (not energised).
        var segmentValues = new double[grid.Segments.Length];
        Array.Fill(segmentValues, double.NaN);
        double[] probabilities;
        var crossCountryProbability = 0.0;
        var outcome = !consistent && CrossCountryRanking.Applies(computation, best) ? CrossCountryRanking.Rank(computation, scores, options) : null;
        // Pairs are reported where they explain the evidence better than any single fault: the best pair
        // passes the consistency check, or it is more probable than every single segment. The evidence
        // stays inconsistent all the same: no single fault explains it.
        if (outcome is not null && !outcome.Pairs.IsEmpty
            && (outcome.Consistent || outcome.Pairs[0].Probability > outcome.SingleProbabilities.Max()))
        {
            probabilities = [.. outcome.SingleProbabilities];
            crossCountry = outcome.Pairs;
            crossCountryProbability = Math.Max(0, 1 - outcome.SingleProbabilities.Sum());
            foreach (var (segment, share) in outcome.SegmentShares)
            {
                segmentValues[segment] = share;
            }
        }
        else
        {
            probabilities = LogMath.Normalise(singleLogs);
        }

        for (var k = 0; k < scores.Count; k++)
        {
            var segment = scores[k].Segment;
            segmentValues[segment] = (double.IsNaN(segmentValues[segment]) ? 0 : segmentValues[segment]) + probabilities[k];
        }

        // Most probable first, ties by id (ordinal). A section's probability sums its segments' in that order.
        var segmentOrder = RankingOrder.Ranked(RankingOrder.Segments(grid), segmentValues);
        var rankedSegments = segmentOrder
            .Select(k => new RankedSegment(grid.Segments[k].Id, sections.OfSegment(k).Id, segmentValues[k]))
            .ToImmutableArray();
        var sectionValues = new double[sections.All.Length];
        Array.Fill(sectionValues, double.NaN);
        foreach (var k in segmentOrder)
        {
            var section = sections.IndexOfSegment(k);
            sectionValues[section] = (double.IsNaN(sectionValues[section]) ? 0 : sectionValues[section]) + segmentValues[k];
        }

        var rankedSections = RankingOrder.Ranked(RankingOrder.Sections(sections), sectionValues)
            .Select(k => new RankedSection(sections.All[k].Id, sections.All[k].Segments, sectionValues[k]))
            .ToImmutableArray();

        // Only the suspects reported are explained: the first of the list that were scored.
        var scoreOfSegment = new SegmentScore?[grid.Segments.Length];
        foreach (var s in scores)
        {
            scoreOfSegment[s.Segment] = s;
        }

        var explanations = ImmutableArray.CreateBuilder<SuspectExplanation>();
        for (var k = 0; k < Math.Min(options.ExplainedSuspects, segmentOrder.Count); k++)
        {
            if (scoreOfSegment[segmentOrder[k]] is { } score)
            {
                explanations.Add(SuspectExplainer.Explain(computation, score, rankedSegments[k].Probability, distances));
            }
        }

        return new RankingResult(
            consistent && explainedByRecorded,
            rankedSegments,
            rankedSections,
            explanations.ToImmutable(),
            consistent && explainedByRecorded ? [] : [.. bestChecks.Where(c => !c.Agrees)],
            crossCountry,
            [.. computation.LeftOut],
            FaultTypeProbabilities(scores),
            Assumptions(computation))
        {
            Transient = computation.Incident.Reclosing is { Transient: true },
            Expired = [.. computation.Expired],
            CrossCountryProbability = crossCountryProbability,
            SwitchSuspects = switchSuspects,
        };
    }

    private static (ImmutableArray<IndicationCheck> Checks, bool Consistent) Judge(RankingComputation computation, SegmentScore best, DistanceCalculator distances, bool refined)
    {
        var checks = SuspectExplainer.Checks(computation, best.Segment, best.Best, refined ? best.Best.Position : 0.5);
        var explanation = SuspectExplainer.Explain(computation, best, 0, distances, refined, withWindow: false, checks);
        var consistent = ConsistencyCheck.Explains(checks, explanation.Measurements, computation.TripLogFactor(best.Segment) == 0, computation.Options);
        return (checks, consistent);
    }

    private static ImmutableDictionary<FaultType, double> FaultTypeProbabilities(List<SegmentScore> scores)
    {
        // Each type's log-sum over the segments in their order, the types in the order they first appear.
        var types = new List<FaultType>();
        var logs = new List<double>();
        foreach (var s in scores)
        {
            foreach (var (type, log) in s.LogByType)
            {
                var t = types.IndexOf(type);
                if (t < 0)
                {
                    types.Add(type);
                    logs.Add(double.NegativeInfinity);
                    t = types.Count - 1;
                }

                logs[t] = LogMath.Add(logs[t], s.LogPrior + log);
            }
        }

        var p = LogMath.Normalise(logs);
        var builder = ImmutableDictionary.CreateBuilder<FaultType, double>();
        for (var t = 0; t < types.Count; t++)
        {
            builder.Add(types[t], p[t]);
        }

        return builder.ToImmutable();
    }

    private static ImmutableArray<string> Assumptions(RankingComputation computation)
    {
        var o = computation.Options;
        static string Pct(double p) => (p * 100).ToString("0.#", CultureInfo.InvariantCulture) + " %";
        static string Ohms(ImmutableArray<double> r) => string.Join(", ", r.Select(x => x.ToString(CultureInfo.InvariantCulture))) + " Ω";
        var list = new List<string>
        {
            $"indicator error rates: remote miss {Pct(o.RemoteRates.MissProbability)}, false {Pct(o.RemoteRates.FalseReportProbability)}; field-read miss {Pct(o.FieldRates.MissProbability)}, false {Pct(o.FieldRates.FalseReportProbability)}, misread {Pct(o.FieldRates.MisreadProbability)} (learned rates replace them where history exists)",
            $"indications read more than the indicator's reset time after the fault (counted from {(computation.Incident.FaultAt is null ? "reportedAt; faultAt not given" : "faultAt")}) carry no weight; read before a trial re-energisation they weigh {Pct(o.StaleWeight)}",
            $"fault resistance marginalised over: earth faults on isolated and resonant networks {Ohms(o.HighResistanceEarthFaultOhms)}; on solid and impedance networks {Ohms(o.LowResistanceEarthFaultOhms)}, joined by the higher values of the first range up to {o.HighResistanceEarthFaultOhms.Max().ToString(CultureInfo.InvariantCulture)} Ω (half the prior where nothing tripped, {Pct(o.HighResistanceTripShare)} where a device tripped: a sensitive earth-fault trip); short circuits {Ohms(o.ShortCircuitOhms)}",
            $"measurement tolerance{(computation.Priors.MeasurementErrors == LearnedMeasurementErrors.None ? string.Empty : " (widened to the error learned from outcomes where larger)")}: phase current {Pct(o.PhaseCurrentTolerance.Relative)} + {o.PhaseCurrentTolerance.Absolute.ToString(CultureInfo.InvariantCulture)} A, residual current {Pct(o.ResidualCurrentTolerance.Relative)} + {o.ResidualCurrentTolerance.Absolute.ToString(CultureInfo.InvariantCulture)} A, neutral voltage {Pct(o.NeutralVoltageTolerance.Relative)} + {o.NeutralVoltageTolerance.Absolute.ToString(CultureInfo.InvariantCulture)} V",
            "indications and records are compared with a fault at each segment's midpoint, or at several positions along it where the fault current's drop along the segment exceeds 1 % of the phase voltage",
            $"a segment is scored in full unless an upper bound of its likelihood shows its posterior below e^-{RankingComputation.PrunedBelowNats.ToString(CultureInfo.InvariantCulture)}/segments of the best found (those together hold less than e^-{RankingComputation.PrunedBelowNats.ToString(CultureInfo.InvariantCulture)} of it): such a segment is listed with probability 0",
            $"an indicator picks up within a tolerance of its setting (σ of ln I/I_pickup = {o.PickupTolerance.ToString(CultureInfo.InvariantCulture)}): near its pickup either state fits",
            "load current is ignored in the fault currents (reference model); Z2 = Z1",
            $"predictions at voltage factor c = {o.VoltageFactor.ToString(CultureInfo.InvariantCulture)} (recorded values are compared with the current at nominal voltage, within the tolerances; IEC 60909-0's cmax = 1.1 is for ratings)",
        };
        list.Add($"switch positions as recorded; a switch whose other position could explain the evidence (the closing of an open switch onto a dead part whose indicators picked up, ties first; at most {o.SwitchSuspectCandidates}) is tried in it with a prior of {Pct(o.WrongSwitchPositionPrior)} and reported from {Pct(SwitchSuspicion.ReportedFrom)}; the probabilities above are those of the recorded positions");
        if (computation.Incident.TrippedDevice is { } tripped)
        {
            list.Add($"the fault lies where {tripped} would have seen it; elsewhere a factor {o.OutsideTrippedZoneFactor.ToString(CultureInfo.InvariantCulture)} (maloperation or a wrong switch state)");
        }

        var incident = computation.Incident;
        if (!incident.Fuses.IsEmpty)
        {
            list.Add($"fuses: a blown fuse puts the fault beyond it; an intact one puts it elsewhere where the fault current would have blown it (above its rating; without one, any short circuit and a tripping earth fault on solid and impedance networks); error probability {Pct(o.FuseErrorProbability)}");
        }

        if (!incident.Relays.IsDefaultOrEmpty)
        {
            list.Add($"relays: an earth-fault direction forward puts the fault beyond the device, reverse or none elsewhere on its network (short circuits: none everywhere); a fault locator's reactance is compared with the lines' x1 from the device ({Pct(o.FaultReactanceTolerance.Relative)} + {o.FaultReactanceTolerance.Absolute.ToString(CultureInfo.InvariantCulture)} Ω, averaged along each segment; not for earth faults on isolated and resonant networks); error probability {Pct(o.RelayErrorProbability)}");
        }

        if (incident.Reclosing is { } reclosing)
        {
            list.Add(reclosing.Transient
                ? $"{reclosing.Device} reclosed successfully after {reclosing.Attempts} attempt(s): a transient fault, ranked for the patrol; nothing needs isolating"
                : $"{reclosing.Device} locked out after {reclosing.Attempts} reclosure(s): a permanent fault beyond it");
        }

        if (computation.Expired.Count > 0)
        {
            list.Add($"read after their reset time, without weight: {string.Join(", ", computation.Expired)}");
        }

        if (computation.LeftOut.Count > 0)
        {
            list.Add($"left out as suspect by the operator: {string.Join(", ", computation.LeftOut)}");
        }

        return [.. list];
    }
}
