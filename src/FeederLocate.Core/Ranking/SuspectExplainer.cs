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

    /// <summary>The explanation of a suspect; <paramref name="checks"/>, where given, are its <see cref="Checks"/> already worked out (at the same position).</summary>
    public static SuspectExplanation Explain(RankingComputation computation, SegmentScore score, double probability, DistanceCalculator distances, bool refined = false, bool withWindow = true, ImmutableArray<IndicationCheck>? checks = null)
    {
        var indications = checks ?? Checks(computation, score.Segment, score.Best, refined ? score.Best.Position : 0.5);
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
            [.. indications.Where(c => c.Agrees)],
            [.. indications.Where(c => !c.Agrees)],
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
        var records = new List<int>();
        for (var m = 0; m < computation.Measured.Count; m++)
        {
            if (computation.Measured[m].Measurement.PhaseCurrentA is not null)
            {
                records.Add(m);
            }
        }

        if (!fallsWithDistance || records.Count == 0)
        {
            return null;
        }

        var beyond = computation.RecordsBeyond(score.Segment);
        var tolerance = computation.Options.PhaseCurrentTolerance;
        var measuredA = new double[records.Count];
        for (var r = 0; r < records.Count; r++)
        {
            measuredA[r] = computation.Measured[records[r]].Measurement.PhaseCurrentA!.Value;
        }

        // Every fitting point's distance and log-likelihood; the window is the extent of those within a
        // factor of 20 of the best. One pass, no per-point allocation.
        const int steps = 50;
        var model = computation.Model;
        var places = new FaultPlace[steps + 1];
        for (var k = 0; k <= steps; k++)
        {
            places[k] = model.Place(score.Segment, k / (double)steps);
        }

        var points = new List<(double Km, double Log)>();
        var best = double.NegativeInfinity;
        foreach (var rf in computation.FineResistancesFor(score.Segment, score.Best.Type))
        {
            for (var k = 0; k <= steps; k++)
            {
                var fault = model.Solve(places[k], score.Best.Type, rf);
                if (!Fits(computation, records, measuredA, beyond, tolerance, fault))
                {
                    continue;
                }

                var log = computation.MeasurementLogLikelihoodDirect(fault, beyond);
                points.Add((distances.AlongSegmentKm(score.Segment, k / (double)steps), log));
                if (log > best)
                {
                    best = log;
                }
            }
        }

        if (points.Count == 0)
        {
            return null;
        }

        // Of the points where the phase current fits, those the other records find about as likely as the best.
        var floor = best - Math.Log(20);
        var (fromKm, toKm) = (double.PositiveInfinity, double.NegativeInfinity);
        foreach (var (km, log) in points)
        {
            if (log >= floor)
            {
                fromKm = Math.Min(fromKm, km);
                toKm = Math.Max(toKm, km);
            }
        }

        return new DistanceWindow(fromKm, toKm);
    }

    /// <summary>Whether the faulted-phase current of every record with one fits the fault within 2σ.</summary>
    private static bool Fits(RankingComputation computation, List<int> records, double[] measuredA, bool[] beyond, MeasurementTolerance tolerance, in FaultSolution fault)
    {
        for (var r = 0; r < records.Count; r++)
        {
            var m = records[r];
            var predicted = computation.Predicted(m, beyond[m], fault).PhaseA;
            var sigma = MeasurementLikelihood.Sigma(tolerance, predicted);
            if (!(Math.Abs(measuredA[r] - predicted) <= 2 * sigma))
            {
                return false;
            }
        }

        return true;
    }

    private static MeasurementCheck Check(SwitchId device, string quantity, double measured, double predicted, MeasurementTolerance tolerance) =>
        new(device, quantity, measured, predicted, (measured - predicted) / MeasurementLikelihood.Sigma(tolerance, predicted));
}
