using System.Collections.Immutable;
using FeederLocate.Core.Learning.PriorChoice;
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
/// <para>With <see cref="FaultRateOptions.ChooseStrengthsByData"/> the segment prior is Gamma(μ·S, S) with μ and S
/// chosen per line type by empirical Bayes (<see cref="FaultRatePriorChoice"/>): the marginal likelihood of every
/// segment's count decides how alike the type's segments are, and so how far each segment's own record moves
/// its rate. μ is then learned from all the type's segments at once, without counting any fault twice.</para>
/// <para>With <see cref="FaultRateOptions.SetApartDistinctSegments"/> as well, the segments the type's prior cannot
/// explain are set apart before μ and S are chosen (<see cref="DistinctMembers"/>) and take the weak prior
/// Gamma(μ·S_min, S_min), S_min = <see cref="FaultRateOptions.MinimumStrengthKmYears"/>: an outlier then neither
/// lowers the strength every other segment of its type is held with nor pulls μ.</para>
/// <para>T is <see cref="FaultRateOptions.ObservationYears"/> when configured, else the span from the
/// earliest to the latest reported time in years of 365.25 days, at least
/// <see cref="FaultRateOptions.MinimumObservationYears"/>; with no fault at all and no configured period T = 0
/// and every posterior equals its prior.</para>
/// </remarks>
public static class FaultRateLearning
{
    public static FaultRateEstimate Learn(Grid grid, IEnumerable<OutcomeSite> faults, FaultRateOptions? options = null)
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
        var memberIndex = new int[grid.Segments.Length];
        var members = new Dictionary<LineTypeId, int>();
        for (var i = 0; i < grid.Segments.Length; i++)
        {
            memberIndex[i] = members.GetValueOrDefault(grid.Segments[i].LineType);
            members[grid.Segments[i].LineType] = memberIndex[i] + 1;
        }

        var segmentRates = grid.Segments.Select((segment, i) =>
        {
            var choice = typeById[segment.LineType].Choice!;
            var strength = choice.StrengthOf(memberIndex[i]);
            var prior = new GammaParameters(choice.MeanPerKmYear * strength, strength);
            var exposure = segment.LengthKm * years;
            return new FaultRatePosterior(segment.Id, segment.LineType, segment.LengthKm, prior,
                prior.Update(faultsOnSegment[i], exposure), faultsOnSegment[i], exposure);
        }).ToImmutableArray();

        return new FaultRateEstimate(typeRates, segmentRates, years, counted, [.. unknown]);
    }

    /// <summary>T in years: the configured period, else the span of the history (at least the minimum), 0 without history.</summary>
    public static double ObservationYears(IReadOnlyCollection<OutcomeSite> faults, FaultRateOptions options)
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
        var posterior = prior.Update(faults, exposure);
        var stated = type.EffectiveFaultsPer100KmYear / 100;
        SegmentRecord[] records = [.. grid.Segments.Select((s, i) => (s, i)).Where(p => p.s.LineType == type.Id).Select(p => new SegmentRecord(faultsOnSegment[p.i], p.s.LengthKm * years))];
        var choice = !(options.ChooseStrengthsByData && stated > 0 && exposure > 0)
            ? FaultRatePriorChoice.Configured(posterior.Mean, options.SegmentShrinkKmYears)
            : options.SetApartDistinctSegments
                ? FaultRatePriorChoice.ChooseSettingApart(stated, e0, records, options.MinimumStrengthKmYears, options.MaximumStrengthKmYears, options.DistinctSegmentShare)
                : FaultRatePriorChoice.Choose(stated, e0, records, options.MinimumStrengthKmYears, options.MaximumStrengthKmYears);
        return new LineTypeFaultRate(type.Id, lengthKm, prior, posterior, faults, exposure, choice);
    }
}
