using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// An indication that carries evidence, compiled: the indicator's measuring point and the log-probability
/// of its record for each state it could be expected to show, already weighted for staleness.
/// </summary>
internal sealed record ObservedIndication(
    int IndicatorIndex,
    Indicator Indicator,
    Indication Indication,
    MeasuringPoint Point,
    IndicatorErrorRates Rates,
    bool Stale,
    double Weight,
    double[] LogProbabilityByExpected,
    double[] ProbabilityByExpected)
{
    public double LogProbability(IndicatorState expected) => LogProbabilityByExpected[(int)expected];

    /// <summary>
    /// Weighted log P(record) where the indicator picks up (showing <paramref name="picked"/>) with
    /// probability <paramref name="pickup"/> and otherwise shows none.
    /// </summary>
    public double LogProbability(double pickup, IndicatorState picked) =>
        pickup <= 0 ? LogProbability(IndicatorState.None)
        : pickup >= 1 ? LogProbability(picked)
        : Weight * Math.Log((pickup * ProbabilityByExpected[(int)picked]) + ((1 - pickup) * ProbabilityByExpected[(int)IndicatorState.None]));

    /// <summary>
    /// Weighted log P(record) for the currents the indicator sees: its phase element (on the fault's path)
    /// and its earth element each pick up on the <see cref="PickupCurve"/>.
    /// </summary>
    public double LogProbability(bool faultBeyond, bool onPath, double phaseCurrentA, double residualCurrentA, double sigma)
    {
        var p = Point;
        var phase = onPath ? PickupCurve.Probability(phaseCurrentA, p.PhasePickupA, sigma) : 0;
        var earth = PickupCurve.Probability(residualCurrentA, p.EarthPickupA, sigma);
        var pickup = 1 - ((1 - phase) * (1 - earth));
        var picked = !p.Directional ? IndicatorState.Fault : faultBeyond ? IndicatorState.Forward : IndicatorState.Reverse;
        return LogProbability(pickup, picked);
    }
}

/// <summary>A substation measurement compiled against the measuring point of its device.</summary>
internal sealed record MeasurementPoint(SubstationMeasurement Measurement, MeasuringPoint Point);

internal static class EvidencePoints
{
    public static List<ObservedIndication> Indications(Grid grid, Incident incident, FaultResponseModel model, RankingOptions options, RankingPriors priors, List<IndicatorId> leftOut, List<IndicatorId> expired)
    {
        var observed = new List<ObservedIndication>();
        foreach (var indication in incident.Indications)
        {
            if (indication.Distrusted)
            {
                leftOut.Add(indication.Indicator);
                continue;
            }

            if (indication.State == IndicatorState.Unknown)
            {
                continue;
            }

            var index = grid.IndicatorIndex(indication.Indicator);
            var indicator = grid.Indicators[index];
            if (IsExpired(indicator, indication, incident))
            {
                // The flag may have reset before it was read: the reading carries no weight at all, as if absent.
                expired.Add(indication.Indicator);
                continue;
            }

            var rates = RatesOf(indicator, indication, options, priors);
            var stale = IsStale(indicator, indication, incident);
            var weight = stale ? options.StaleWeight : 1.0;
            var table = new double[Enum.GetValues<IndicatorState>().Length];
            var probabilities = new double[table.Length];
            foreach (var expected in Enum.GetValues<IndicatorState>())
            {
                probabilities[(int)expected] = IndicationLikelihood.Probability(indicator, rates, expected, indication.State);
                table[(int)expected] = weight * Math.Log(probabilities[(int)expected]);
            }

            observed.Add(new ObservedIndication(index, indicator, indication, model.IndicatorPoint(index), rates, stale, weight, table, probabilities));
        }

        return observed;
    }

    /// <summary>
    /// The substation measurements compiled against their devices, with the neutral voltage counted once per
    /// bus: U0 is one voltage at the bus, measured by one voltage transformer, that each feeder breaker's
    /// record repeats. Counted once per record it would weigh as often as the bus has feeders (53 times on a
    /// 53-feeder substation). The first record of each energised bus that carries a U0 keeps the mean of the
    /// bus's U0 values (the one reading where they agree); the others keep their currents only. A record at
    /// a dead device stands alone.
    /// </summary>
    public static List<MeasurementPoint> Measurements(Grid grid, Incident incident, FaultResponseModel model)
    {
        var points = incident.Measurements.Select(m => new MeasurementPoint(m, model.SwitchPoint(grid.SwitchIndex(m.Device)))).ToList();
        var busVoltages = points
            .Where(p => p.Point.Substation >= 0 && p.Measurement.NeutralVoltageV is not null)
            .GroupBy(p => p.Point.Substation)
            .ToDictionary(g => g.Key, g => g.Average(p => p.Measurement.NeutralVoltageV!.Value));
        var counted = new HashSet<int>();
        for (var k = 0; k < points.Count; k++)
        {
            var (measurement, point) = (points[k].Measurement, points[k].Point);
            if (point.Substation < 0 || measurement.NeutralVoltageV is null)
            {
                continue;
            }

            points[k] = points[k] with
            {
                Measurement = measurement with { NeutralVoltageV = counted.Add(point.Substation) ? busVoltages[point.Substation] : null },
            };
        }

        return points;
    }

    /// <summary>Read before a trial re-energisation changed what the indicator shows.</summary>
    public static bool IsStale(Indicator indicator, Indication indication, Incident incident) =>
        indication.ReadAt is { } readAt && incident.ReenergisedAt is { } reenergised && readAt < reenergised;

    /// <summary>
    /// Read more than the indicator's reset time after the fault (<see cref="Incident.FaultAt"/>, else
    /// <see cref="Incident.ReportedAt"/>): the flag may have reset, so the reading says nothing.
    /// </summary>
    public static bool IsExpired(Indicator indicator, Indication indication, Incident incident) =>
        indication.ReadAt is { } readAt && indicator.ResetTime is { } reset
        && readAt - incident.AgeOrigin > reset;

    private static IndicatorErrorRates RatesOf(Indicator indicator, Indication indication, RankingOptions options, RankingPriors priors)
    {
        var byKind = indication.Source == IndicationSource.Field ? options.FieldRates : options.RemoteRates;
        return priors.IndicatorRates.TryGetValue(indicator.Id, out var learned)
            ? learned with { MisreadProbability = byKind.MisreadProbability }
            : byKind;
    }
}
