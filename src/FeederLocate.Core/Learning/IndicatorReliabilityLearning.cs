using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// Beta-binomial estimates of each indicator's P(miss) and P(false report), in two levels.
/// </summary>
/// <remarks>
/// <para>Kind level: prior Beta(a0, b0) = Beta(p·n0, (1 − p)·n0), p the kind's default rate
/// (<see cref="IndicatorReliabilityOptions"/>), n0 = <see cref="IndicatorReliabilityOptions.PriorStrength"/>.
/// Posterior Beta(a0 + Σx, b0 + Σ(n − x)) over the counts of every indicator of the kind.
/// Example: Beta(1, 19) and 3 misses in 10 trials give Beta(4, 26), mean 4/30 = 0.133.</para>
/// <para>Indicator level: Beta(m·s + x, (1 − m)·s + n − x), m the kind's posterior mean and
/// s = <see cref="IndicatorReliabilityOptions.ShrinkStrength"/>. Its mean (m·s + x)/(s + n) starts at the
/// kind's rate and moves toward the indicator's own x/n as n grows past s. The indicator's counts also sit
/// in its kind's pool (the usual empirical-Bayes simplification).</para>
/// <para>What counts as a trial, a miss or a false report: <see cref="ReliabilityCounts"/>.</para>
/// </remarks>
public static class IndicatorReliabilityLearning
{
    public static IndicatorReliabilityEstimate Learn(
        Grid grid, IEnumerable<IndicatorObservation> observations, IndicatorReliabilityOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(observations);
        options ??= IndicatorReliabilityOptions.Default;

        var counts = new ReliabilityCounts[grid.Indicators.Length];
        Array.Fill(counts, ReliabilityCounts.Zero);
        var unknown = new List<IndicatorId>();
        foreach (var observation in observations)
        {
            if (!grid.HasIndicator(observation.Indicator))
            {
                if (!unknown.Contains(observation.Indicator))
                {
                    unknown.Add(observation.Indicator);
                }

                continue;
            }

            var index = grid.IndicatorIndex(observation.Indicator);
            counts[index] = counts[index].Add(ReliabilityCounts.Of(observation));
        }

        var kinds = IndicatorKind.All.Select(kind => KindReliability(grid, kind, counts, options)).ToImmutableArray();
        var indicators = grid.Indicators.Select((indicator, i) =>
        {
            var kind = kinds.Single(k => k.Kind == IndicatorKind.Of(indicator));
            var c = counts[i];
            return new IndicatorReliability(
                indicator.Id,
                kind.Kind,
                BetaParameters.FromMean(kind.Miss.Mean, options.ShrinkStrength).Update(c.Misses, c.MissTrials),
                BetaParameters.FromMean(kind.FalseReport.Mean, options.ShrinkStrength).Update(c.FalseReports, c.FalseReportTrials),
                c);
        }).ToImmutableArray();

        return new IndicatorReliabilityEstimate(kinds, indicators, [.. unknown]);
    }

    private static IndicatorKindReliability KindReliability(
        Grid grid, IndicatorKind kind, ReliabilityCounts[] counts, IndicatorReliabilityOptions options)
    {
        var pooled = ReliabilityCounts.Zero;
        var members = 0;
        for (var i = 0; i < grid.Indicators.Length; i++)
        {
            if (IndicatorKind.Of(grid.Indicators[i]) == kind)
            {
                pooled = pooled.Add(counts[i]);
                members++;
            }
        }

        var missPrior = BetaParameters.FromMean(options.MissProbability(kind), options.PriorStrength);
        var falsePrior = BetaParameters.FromMean(options.FalseReportProbability(kind), options.PriorStrength);
        return new IndicatorKindReliability(
            kind,
            members,
            missPrior,
            falsePrior,
            missPrior.Update(pooled.Misses, pooled.MissTrials),
            falsePrior.Update(pooled.FalseReports, pooled.FalseReportTrials),
            pooled);
    }
}
