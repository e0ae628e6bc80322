using System.Collections.Immutable;
using FeederLocate.Core.Learning.PriorChoice;
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
/// <para>With <see cref="IndicatorReliabilityOptions.ChooseStrengthsByData"/> the kind's rate m and strength s of
/// each error rate are chosen by empirical Bayes (<see cref="ReliabilityPriorChoice"/>) from the counts of all
/// its indicators; each indicator's posterior is then Beta(m·s + x, (1 − m)·s + n − x).</para>
/// <para>With <see cref="IndicatorReliabilityOptions.SetApartDistinctIndicators"/> as well, the indicators the kind's
/// prior cannot explain are set apart before m and s are chosen (<see cref="DistinctMembers"/>) and take the weak
/// prior at <see cref="IndicatorReliabilityOptions.MinimumStrengthTrials"/>.</para>
/// <para>Directional indicators also learn P(wrong direction) from their direction trials, in the same two levels
/// (default rate <see cref="IndicatorReliabilityOptions.WrongDirectionProbability"/>).</para>
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
        var memberIndex = new int[grid.Indicators.Length];
        var members = new Dictionary<IndicatorKind, int>();
        for (var i = 0; i < grid.Indicators.Length; i++)
        {
            var kind = IndicatorKind.Of(grid.Indicators[i]);
            memberIndex[i] = members.GetValueOrDefault(kind);
            members[kind] = memberIndex[i] + 1;
        }

        var indicators = grid.Indicators.Select((indicator, i) =>
        {
            var kind = kinds.Single(k => k.Kind == IndicatorKind.Of(indicator));
            var c = counts[i];
            var member = memberIndex[i];
            return new IndicatorReliability(
                indicator.Id,
                kind.Kind,
                Posterior(kind.MissChoice!, member, c.Misses, c.MissTrials),
                Posterior(kind.FalseReportChoice!, member, c.FalseReports, c.FalseReportTrials),
                c,
                kind.WrongDirectionChoice is { } direction ? Posterior(direction, member, c.WrongDirections, c.DirectionTrials) : null);
        }).ToImmutableArray();

        return new IndicatorReliabilityEstimate(kinds, indicators, [.. unknown]);
    }

    private static IndicatorKindReliability KindReliability(
        Grid grid, IndicatorKind kind, ReliabilityCounts[] counts, IndicatorReliabilityOptions options)
    {
        var pooled = ReliabilityCounts.Zero;
        for (var i = 0; i < grid.Indicators.Length; i++)
        {
            if (IndicatorKind.Of(grid.Indicators[i]) == kind)
            {
                pooled = pooled.Add(counts[i]);
            }
        }

        var missPrior = BetaParameters.FromMean(options.MissProbability(kind), options.PriorStrength);
        var falsePrior = BetaParameters.FromMean(options.FalseReportProbability(kind), options.PriorStrength);
        var miss = missPrior.Update(Math.Min(pooled.Misses, pooled.MissTrials), pooled.MissTrials);
        var falseReport = falsePrior.Update(Math.Min(pooled.FalseReports, pooled.FalseReportTrials), pooled.FalseReportTrials);
        var members = Enumerable.Range(0, grid.Indicators.Length).Where(i => IndicatorKind.Of(grid.Indicators[i]) == kind).ToList();
        ReliabilityPriorChoice Choice(double defaultRate, BetaParameters pooledPosterior, Func<ReliabilityCounts, TrialRecord> record)
        {
            var records = members.Select(i => record(counts[i])).ToList();
            return !(options.ChooseStrengthsByData && records.Any(r => r.Trials > 0))
                ? ReliabilityPriorChoice.Configured(pooledPosterior.Mean, options.ShrinkStrength)
                : options.SetApartDistinctIndicators
                    ? ReliabilityPriorChoice.ChooseSettingApart(defaultRate, options.PriorStrength, records, options.MinimumStrengthTrials, options.MaximumStrengthTrials, options.DistinctIndicatorShare)
                    : ReliabilityPriorChoice.Choose(defaultRate, options.PriorStrength, records, options.MinimumStrengthTrials, options.MaximumStrengthTrials);
        }

        ReliabilityPriorChoice? direction = null;
        if (kind.Directional)
        {
            var directionPosterior = BetaParameters.FromMean(options.WrongDirectionProbability, options.PriorStrength)
                .Update(Math.Min(pooled.WrongDirections, pooled.DirectionTrials), pooled.DirectionTrials);
            direction = Choice(options.WrongDirectionProbability, directionPosterior, c => new TrialRecord(c.WrongDirections, c.DirectionTrials));
        }

        return new IndicatorKindReliability(kind, members.Count, missPrior, falsePrior, miss, falseReport, pooled)
        {
            MissChoice = Choice(options.MissProbability(kind), miss, c => new TrialRecord(c.Misses, c.MissTrials)),
            FalseReportChoice = Choice(options.FalseReportProbability(kind), falseReport, c => new TrialRecord(c.FalseReports, c.FalseReportTrials)),
            WrongDirectionChoice = direction,
        };
    }

    private static BetaParameters Posterior(ReliabilityPriorChoice choice, int member, double errors, double trials) =>
        BetaParameters.FromMean(choice.Mean, choice.StrengthOf(member)).Update(Math.Min(errors, trials), trials);
}
