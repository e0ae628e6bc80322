using System.Collections.Immutable;
using System.Numerics;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// Two earth faults on different phases at once, on an isolated or resonant network: considered only
/// when single faults explain the evidence badly. The current is that of a phase-to-phase loop closed
/// through earth between the two fault points (an approximation, listed with the result): phase current
/// on the paths to both points, residual current only beyond the point where the paths part.
/// </summary>
internal static class CrossCountryRanking
{
    private static readonly double[] LoopResistancesOhm = [0, 10, 50];

    public static bool Applies(RankingComputation computation, SegmentScore best)
    {
        var network = computation.Network;
        var scheme = computation.Model.Grid.Substations[network.SubstationIndexOf(network.SuppliedEndOf(best.Segment))].Grounding.Scheme;
        return scheme is GroundingScheme.Isolated or GroundingScheme.Resonant
            && computation.Incident.FaultType is null or FaultType.LG or FaultType.LLG;
    }

    public static Outcome Rank(RankingComputation computation, List<SegmentScore> scores, RankingOptions options)
    {
        var model = computation.Model;
        var network = computation.Network;
        var grid = model.Grid;
        var candidates = Candidates(computation, scores, options);
        var priorSum = scores.Sum(s => Math.Exp(s.LogPrior));
        var logSingleShare = Math.Log(1 - options.CrossCountryPrior);
        var logs = scores.Select(s => logSingleShare + s.LogPrior - Math.Log(priorSum) + s.LogMarginal).ToList();

        var pairs = new List<(int A, int B, double Log, IndicatorState[] Expected, (double, double)[] Predicted, bool InsideTrip)>();
        var beyond = candidates.Select(c => Beyond(computation, c.Segment)).ToList();
        for (var i = 0; i < candidates.Count; i++)
        {
            for (var j = i + 1; j < candidates.Count; j++)
            {
                var (a, b) = (candidates[i].Segment, candidates[j].Segment);
                if (network.SubstationIndexOf(network.SuppliedEndOf(a)) != network.SubstationIndexOf(network.SuppliedEndOf(b)))
                {
                    continue;
                }

                var prior = Math.Log(options.CrossCountryPrior) + candidates[i].LogPrior + candidates[j].LogPrior - (2 * Math.Log(priorSum)) + Math.Log(2);
                var best = (Log: double.NegativeInfinity, Expected: Array.Empty<IndicatorState>(), Predicted: Array.Empty<(double, double)>(), Inside: false);
                var marginal = double.NegativeInfinity;
                foreach (var rf in LoopResistancesOhm)
                {
                    var current = LoopCurrentA(model, a, b, rf);
                    var (log, expected, predicted, inside) = Likelihood(computation, a, b, beyond[i], beyond[j], current, options);
                    marginal = LogMath.Add(marginal, log - Math.Log(LoopResistancesOhm.Length));
                    if (log > best.Log)
                    {
                        best = (log, expected, predicted, inside);
                    }
                }

                pairs.Add((a, b, prior + marginal, best.Expected, best.Predicted, best.Inside));
            }
        }

        var all = logs.Concat(pairs.Select(p => p.Log)).ToList();
        var p = LogMath.Normalise(all);
        var shares = new Dictionary<int, double>();
        var ranked = new List<CrossCountrySuspect>();
        for (var k = 0; k < pairs.Count; k++)
        {
            var probability = p[scores.Count + k];
            shares[pairs[k].A] = shares.GetValueOrDefault(pairs[k].A) + (probability / 2);
            shares[pairs[k].B] = shares.GetValueOrDefault(pairs[k].B) + (probability / 2);
            ranked.Add(new CrossCountrySuspect(grid.Segments[pairs[k].A].Id, grid.Segments[pairs[k].B].Id, probability));
        }

        var consistent = false;
        if (pairs.Count > 0)
        {
            var top = pairs.MaxBy(x => x.Log);
            consistent = ConsistencyCheck.Explains(Checks(computation, top.Expected), MeasurementChecks(computation, top.Predicted), top.InsideTrip, options);
        }

        return new Outcome(
            [.. p.Take(scores.Count)],
            [.. ranked.OrderByDescending(r => r.Probability).Take(10)],
            shares,
            consistent);
    }

    /// <summary>The best single-fault segments, plus the segment of every indicator that picked up.</summary>
    private static List<SegmentScore> Candidates(RankingComputation computation, List<SegmentScore> scores, RankingOptions options)
    {
        var bySegment = scores.ToDictionary(s => s.Segment);
        var picked = computation.Observed
            .Where(o => o.Indication.State is not IndicatorState.None)
            .Select(o => computation.Model.Grid.SegmentIndex(o.Indicator.Segment))
            .Where(bySegment.ContainsKey)
            .Select(s => bySegment[s]);
        return [.. scores.OrderByDescending(s => s.LogPosterior).Take(options.CrossCountryCandidates)
            .Concat(picked.OrderByDescending(s => s.LogPosterior).Take(options.CrossCountryCandidates)).Distinct()];
    }

    /// <summary>√3·E over the loop: both phases from the source to where the paths part, then each phase and earth to its fault point.</summary>
    private static double LoopCurrentA(FaultResponseModel model, int a, int b, double loopResistanceOhm)
    {
        var network = model.Network;
        var sums = model.Aggregates;
        var grid = model.Grid;
        var upA = network.SuppliedEndOf(a);
        var upB = network.SuppliedEndOf(b);
        var substation = grid.Substations[network.SubstationIndexOf(upA)];
        var e = Units.PhaseVoltageV(substation.NominalVoltageKv, model.VoltageFactor);
        var source = SourceImpedance.AtBusbarOhm(substation, model.VoltageFactor);
        var ancestors = new HashSet<int>();
        for (var v = upA; v >= 0; v = network.ParentOf(v))
        {
            ancestors.Add(v);
        }

        var branch = upB;
        while (!ancestors.Contains(branch))
        {
            branch = network.ParentOf(branch);
        }

        Complex EarthLoopBeyondBranch(int segment, int up)
        {
            var seg = grid.Segments[segment];
            var type = grid.LineTypeOf(seg);
            var z1 = sums.PositiveSequencePathOhm(up) + (new Complex(type.R1OhmPerKm, type.X1OhmPerKm) * seg.LengthKm / 2) - sums.PositiveSequencePathOhm(branch);
            var z0 = sums.ZeroSequencePathOhm(up) + (new Complex(type.R0OhmPerKm, type.X0OhmPerKm) * seg.LengthKm / 2) - sums.ZeroSequencePathOhm(branch);
            return ((2 * z1) + z0) / 3;
        }

        var loop = (2 * (source + sums.PositiveSequencePathOhm(branch))) + EarthLoopBeyondBranch(a, upA) + EarthLoopBeyondBranch(b, upB) + (2 * loopResistanceOhm);
        return Math.Sqrt(3) * e / loop.Magnitude;
    }

    /// <summary>Which observed indicators and which records have a fault on the segment beyond them.</summary>
    private static (bool[] Indicators, bool[] Records) Beyond(RankingComputation computation, int segment) =>
        ([.. computation.Observed.Select(o => computation.Model.IsFaultBeyond(o.Point, segment))],
         [.. computation.Measured.Select(r => computation.Model.IsFaultBeyond(r.Point, segment))]);

    private static (double Log, IndicatorState[] Expected, (double, double)[] Predicted, bool InsideTrip) Likelihood(
        RankingComputation computation, int a, int b, (bool[] Indicators, bool[] Records) beyondOfA, (bool[] Indicators, bool[] Records) beyondOfB,
        double currentA, RankingOptions options)
    {
        var model = computation.Model;
        var substation = model.Network.SubstationIndexOf(model.Network.SuppliedEndOf(a));
        var log = 0.0;
        var expected = new IndicatorState[computation.Observed.Count];
        for (var i = 0; i < expected.Length; i++)
        {
            var o = computation.Observed[i];
            var (beyondA, beyondB) = (beyondOfA.Indicators[i], beyondOfB.Indicators[i]);
            var same = o.Point.Substation == substation;
            var onPath = same && (o.Point.OnPath(beyondA) || o.Point.OnPath(beyondB));
            var phase = onPath ? currentA : 0;
            var residual = beyondA != beyondB ? currentA : 0;
            expected[i] = o.Point.ExpectedState(phase, residual, beyondA || beyondB);
            log += o.LogProbability(expected[i]);
        }

        var predicted = new (double, double)[computation.Measured.Count];
        for (var m = 0; m < predicted.Length; m++)
        {
            var record = computation.Measured[m];
            var (beyondA, beyondB) = (beyondOfA.Records[m], beyondOfB.Records[m]);
            predicted[m] = (beyondA || beyondB ? currentA : 0, beyondA != beyondB ? currentA : 0);

            // The neutral voltage of a cross-country fault is not modelled: that record carries no evidence here.
            log += computation.RecordLogLikelihood(record.Measurement with { NeutralVoltageV = null }, (predicted[m].Item1, predicted[m].Item2, 0));
        }

        var inside = computation.Incident.TrippedDevice is null || computation.TripLogFactor(a) == 0 || computation.TripLogFactor(b) == 0;
        if (!inside)
        {
            log += Math.Log(options.OutsideTrippedZoneFactor);
        }

        return (log, expected, predicted, inside);
    }

    private static ImmutableArray<IndicationCheck> Checks(RankingComputation computation, IndicatorState[] expected) =>
        [.. computation.Observed.Select((o, i) => SuspectExplainer.Check(o, expected[i]))];

    private static ImmutableArray<MeasurementCheck> MeasurementChecks(RankingComputation computation, (double PhaseA, double ResidualA)[] predicted)
    {
        var options = computation.Options;
        var checks = ImmutableArray.CreateBuilder<MeasurementCheck>();
        for (var m = 0; m < predicted.Length; m++)
        {
            var record = computation.Measured[m].Measurement;
            if (record.PhaseCurrentA is { } phase)
            {
                checks.Add(new MeasurementCheck(record.Device, "phaseCurrentA", phase, predicted[m].PhaseA,
                    (phase - predicted[m].PhaseA) / MeasurementLikelihood.Sigma(options.PhaseCurrentTolerance, predicted[m].PhaseA)));
            }

            if (record.ResidualCurrentA is { } residual)
            {
                checks.Add(new MeasurementCheck(record.Device, "residualCurrentA", residual, predicted[m].ResidualA,
                    (residual - predicted[m].ResidualA) / MeasurementLikelihood.Sigma(options.ResidualCurrentTolerance, predicted[m].ResidualA)));
            }
        }

        return checks.ToImmutable();
    }

    internal sealed record Outcome(
        ImmutableArray<double> SingleProbabilities,
        ImmutableArray<CrossCountrySuspect> Pairs,
        Dictionary<int, double> SegmentShares,
        bool Consistent);
}
