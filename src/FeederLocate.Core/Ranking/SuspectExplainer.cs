using System.Collections.Immutable;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>Explains a suspect: each indication against its best-fitting fault, the records, and a distance window.</summary>
internal static class SuspectExplainer
{
    public static ImmutableArray<IndicationCheck> Checks(RankingComputation computation, int segment, BestHypothesis best, double position = 0.5)
    {
        var fault = computation.Model.Solve(segment, position, best.Type, best.FaultResistanceOhm);
        var expected = computation.ExpectedStates(segment, fault);
        return [.. computation.Observed.Select((o, i) => Check(o, expected[i]))];
    }

    /// <summary>One observed indication against the state the suspect makes it expected to show.</summary>
    public static IndicationCheck Check(ObservedIndication o, IndicatorState expected)
    {
        var observed = o.Indication.State;
        return new IndicationCheck(
            o.Indicator.Id,
            observed,
            expected,
            expected == observed,
            IndicationLikelihood.Probability(o.Indicator, o.Rates, expected, observed),
            1 - IndicationLikelihood.Probability(o.Indicator, o.Rates, expected, expected),
            o.Stale,
            IndicationLikelihood.Describe(expected, observed));
    }

    public static SuspectExplanation Explain(RankingComputation computation, SegmentScore score, double probability, DistanceCalculator distances, bool refined = false, bool withWindow = true)
    {
        var checks = Checks(computation, score.Segment, score.Best, refined ? score.Best.Position : 0.5);
        var fault = computation.Model.Solve(score.Segment, score.Best.Position, score.Best.Type, score.Best.FaultResistanceOhm);
        var options = computation.Options;
        var measurements = ImmutableArray.CreateBuilder<MeasurementCheck>();
        foreach (var record in computation.Measured)
        {
            var (phase, residual, neutral) = computation.Predicted(record, score.Segment, fault);
            var m = record.Measurement;
            if (m.PhaseCurrentA is { } p)
            {
                measurements.Add(Check(m.Device, "phaseCurrentA", p, phase, options.PhaseCurrentTolerance));
            }

            if (m.ResidualCurrentA is { } r)
            {
                measurements.Add(Check(m.Device, "residualCurrentA", r, residual, options.ResidualCurrentTolerance));
            }

            if (m.NeutralVoltageV is { } u)
            {
                measurements.Add(Check(m.Device, "neutralVoltageV", u, neutral, options.NeutralVoltageTolerance));
            }
        }

        return new SuspectExplanation(
            computation.Model.Grid.Segments[score.Segment].Id,
            probability,
            score.Best.Type,
            score.Best.FaultResistanceOhm,
            [.. checks.Where(c => c.Agrees)],
            [.. checks.Where(c => !c.Agrees)],
            measurements.ToImmutable(),
            withWindow ? Window(computation, score, distances) : null);
    }

    /// <summary>
    /// Where along the segment the faulted-phase current recorded at the substation fits (within 2σ),
    /// over every fault resistance that explains the records about as well as the best one (within a
    /// likelihood factor of 20): more resistance means less current, so a plausible range of resistance
    /// widens the window toward the source. Only where that current falls with distance (solid and
    /// impedance earthing, or short circuits).
    /// </summary>
    private static DistanceWindow? Window(RankingComputation computation, SegmentScore score, DistanceCalculator distances)
    {
        var grid = computation.Model.Grid;
        var network = computation.Network;
        var scheme = network.SubstationOf(grid.Segments[score.Segment].From)?.Grounding.Scheme;
        var fallsWithDistance = scheme is GroundingScheme.Solid or GroundingScheme.Impedance || score.Best.Type is not (FaultType.LG or FaultType.LLG);
        var records = Enumerable.Range(0, computation.Measured.Count).Where(m => computation.Measured[m].Measurement.PhaseCurrentA is not null).ToList();
        if (!fallsWithDistance || records.Count == 0)
        {
            return null;
        }

        var beyond = computation.RecordsBeyond(score.Segment);

        const int steps = 50;
        var points = new List<(double Km, double Log, bool Fits)>();
        foreach (var rf in computation.FineResistancesFor(score.Segment, score.Best.Type))
        {
            for (var k = 0; k <= steps; k++)
            {
                var position = k / (double)steps;
                var fault = computation.Model.Solve(score.Segment, position, score.Best.Type, rf);
                var fits = records.All(m =>
                {
                    var predicted = computation.Predicted(m, beyond[m], fault).PhaseA;
                    var sigma = MeasurementLikelihood.Sigma(computation.Options.PhaseCurrentTolerance, predicted);
                    return Math.Abs(computation.Measured[m].Measurement.PhaseCurrentA!.Value - predicted) <= 2 * sigma;
                });
                if (fits)
                {
                    points.Add((distances.AlongSegmentKm(score.Segment, position), computation.MeasurementLogLikelihoodDirect(fault, beyond), true));
                }
            }
        }

        if (points.Count == 0)
        {
            return null;
        }

        // Of the points where the phase current fits, those the other records find about as likely as the best.
        var best = points.Max(p => p.Log);
        var inside = points.Where(p => p.Log >= best - Math.Log(20)).ToList();
        return new DistanceWindow(inside.Min(p => p.Km), inside.Max(p => p.Km));
    }

    private static MeasurementCheck Check(SwitchId device, string quantity, double measured, double predicted, MeasurementTolerance tolerance) =>
        new(device, quantity, measured, predicted, (measured - predicted) / MeasurementLikelihood.Sigma(tolerance, predicted));
}
