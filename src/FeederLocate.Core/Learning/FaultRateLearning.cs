using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// Fault rates per line type and per segment from confirmed faults, by Gamma-Poisson updating:
/// faults on a stretch of line are taken as a Poisson process with rate λ per km·year.
/// </summary>
/// <remarks>
/// <para>Line type with stated rate r (faults per 100 km·year, <see cref="LineType.EffectiveFaultsPer100KmYear"/>):
/// prior Gamma(α0, β0), α0 = (r/100)·E0, β0 = E0 (E0 = <see cref="FaultRateOptions.PriorExposureKmYears"/>),
/// so the prior mean is r/100 per km·year and weighs like E0 km·years of history. Posterior
/// Gamma(α0 + k, β0 + X), k the faults on the type's segments, X = (Σ lengths) · T.</para>
/// <para>Segment of length L: prior Gamma(m·S, S) with m the type's posterior mean and
/// S = <see cref="FaultRateOptions.SegmentShrinkKmYears"/>; posterior Gamma(m·S + k_s, S + L·T). Its mean
/// (m·S + k_s)/(S + L·T) moves from the type's rate toward the segment's own k_s/(L·T) as L·T grows past S.
/// The segment's own faults also sit in the type's pool; the double use is the usual empirical-Bayes
/// simplification and is small while a type has several segments.</para>
/// <para>T is <see cref="FaultRateOptions.ObservationYears"/> when configured, else the span from the
/// earliest to the latest reported time in years of 365.25 days, at least
/// <see cref="FaultRateOptions.MinimumObservationYears"/>; with no fault at all and no configured period T = 0
/// and every posterior equals its prior.</para>
/// </remarks>
public static class FaultRateLearning
{
    public static FaultRateEstimate Learn(Grid grid, IEnumerable<ConfirmedFault> faults, FaultRateOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(faults);
        options ??= FaultRateOptions.Default;

        var history = faults.ToList();
        var years = ObservationYears(history, options);
        var faultsOnSegment = new int[grid.Segments.Length];
        var unknown = new List<SegmentId>();
        var counted = 0;
        foreach (var fault in history)
        {
            if (grid.HasSegment(fault.Segment))
            {
                faultsOnSegment[grid.SegmentIndex(fault.Segment)]++;
                counted++;
            }
            else if (!unknown.Contains(fault.Segment))
            {
                unknown.Add(fault.Segment);
            }
        }

        var typeRates = grid.LineTypes.Select(t => LineTypeRate(grid, t, faultsOnSegment, years, options)).ToImmutableArray();
        var typeById = typeRates.ToDictionary(t => t.LineType);
        var segmentRates = grid.Segments.Select((segment, i) =>
        {
            var typeMean = typeById[segment.LineType].Posterior.Mean;
            var prior = new GammaParameters(typeMean * options.SegmentShrinkKmYears, options.SegmentShrinkKmYears);
            var exposure = segment.LengthKm * years;
            return new FaultRatePosterior(segment.Id, segment.LineType, segment.LengthKm, prior,
                prior.Update(faultsOnSegment[i], exposure), faultsOnSegment[i], exposure);
        }).ToImmutableArray();

        return new FaultRateEstimate(typeRates, segmentRates, years, counted, [.. unknown]);
    }

    /// <summary>T in years: the configured period, else the span of the history (at least the minimum), 0 without history.</summary>
    public static double ObservationYears(IReadOnlyCollection<ConfirmedFault> faults, FaultRateOptions options)
    {
        ArgumentNullException.ThrowIfNull(faults);
        ArgumentNullException.ThrowIfNull(options);
        if (options.ObservationYears is { } configured)
        {
            return configured;
        }

        if (faults.Count == 0)
        {
            return 0;
        }

        var span = faults.Max(f => f.ReportedAt) - faults.Min(f => f.ReportedAt);
        return Math.Max(options.MinimumObservationYears, span.TotalDays / FaultRateOptions.DaysPerYear);
    }

    private static LineTypeFaultRate LineTypeRate(Grid grid, LineType type, int[] faultsOnSegment, double years, FaultRateOptions options)
    {
        var lengthKm = 0.0;
        var faults = 0;
        for (var i = 0; i < grid.Segments.Length; i++)
        {
            if (grid.Segments[i].LineType == type.Id)
            {
                lengthKm += grid.Segments[i].LengthKm;
                faults += faultsOnSegment[i];
            }
        }

        var e0 = options.PriorExposureKmYears;
        var prior = new GammaParameters(Units.PerKmYear(type.EffectiveFaultsPer100KmYear) * e0, e0);
        var exposure = lengthKm * years;
        return new LineTypeFaultRate(type.Id, lengthKm, prior, prior.Update(faults, exposure), faults, exposure);
    }
}
