using System.Collections.Immutable;

namespace FeederLocate.Core.Learning.PriorChoice;

/// <summary>One indicator's record for one error rate: x errors in n trials (weighted counts may be fractional).</summary>
public readonly record struct TrialRecord(double Errors, double Trials);

/// <summary>
/// The prior of one error rate of an indicator kind chosen by empirical Bayes: each indicator's rate
/// p ~ Beta(m·s, (1 − m)·s), the kind-level rate m and the strength s (trials) chosen to maximise
/// Σ log BetaBinomial(x_i | n_i, m·s, (1 − m)·s) + n0·(p0·ln m + (1 − p0)·ln(1 − m)) over the kind's indicators.
/// The last term is a weak Beta(p0·n0, (1 − p0)·n0) belief in the default rate p0 (on logit m, so its mode is p0).
/// </summary>
/// <param name="Mean">m: the kind-level rate every indicator of the kind shrinks toward, 0..1.</param>
/// <param name="StrengthTrials">s: the trials of an indicator's own record that weigh as much as m.</param>
/// <param name="AtBound">s lies on a bound: at the upper, the indicators look alike (full pooling).</param>
/// <param name="ChosenByData">False where the kind has no trials: then m is the default and s the configured strength.</param>
/// <param name="LogMarginalLikelihood">The maximised objective (nats), 0 when not chosen by data.</param>
public sealed record ReliabilityPriorChoice(
    double Mean,
    double StrengthTrials,
    double LowerTrials,
    double UpperTrials,
    bool AtBound,
    bool ChosenByData,
    double LogMarginalLikelihood)
{
    /// <summary>
    /// The indicators (indices into the records chosen from) set apart as distinct by <see cref="ChooseSettingApart"/>:
    /// m and s are chosen from the others, and these take the weak prior Beta(m·lower, (1 − m)·lower). Empty otherwise.
    /// </summary>
    public ImmutableArray<int> SetApart { get; init; } = [];

    /// <summary>The strength of the prior of record <paramref name="index"/>: the lower bound where it is set apart, else s.</summary>
    public double StrengthOf(int index) => SetApart.Contains(index) ? LowerTrials : StrengthTrials;

    /// <summary>The smallest and largest kind-level rate searched.</summary>
    public const double MinimumMean = 1e-4;

    /// <summary>The largest kind-level rate searched: an error rate of one half is no indicator at all.</summary>
    public const double MaximumMean = 0.5;

    /// <summary>
    /// Chooses m and s for a kind whose default rate is <paramref name="defaultRate"/> held with
    /// <paramref name="priorStrength"/> (n0), from its indicators' records, s within the bounds.
    /// </summary>
    public static ReliabilityPriorChoice Choose(
        double defaultRate, double priorStrength, IReadOnlyList<TrialRecord> indicators, double lowerTrials, double upperTrials)
    {
        ArgumentNullException.ThrowIfNull(indicators);
        if (indicators.All(i => i.Trials == 0))
        {
            throw new ArgumentException("a choice needs some trials");
        }

        double Objective(double m, double s)
        {
            var sum = priorStrength * ((defaultRate * Math.Log(m)) + ((1 - defaultRate) * Math.Log(1 - m)));
            foreach (var i in indicators)
            {
                sum += MarginalLikelihood.BetaBinomial(Math.Min(i.Errors, i.Trials), i.Trials, m * s, (1 - m) * s);
            }

            return sum;
        }

        BoundedMaximum BestMean(double s) => BoundedMaximiser.Maximise(m => Objective(m, s), MinimumMean, MaximumMean);
        var strength = BoundedMaximiser.Maximise(s => BestMean(s).Value, lowerTrials, upperTrials);
        var mean = BestMean(strength.Argument);
        return new ReliabilityPriorChoice(mean.Argument, strength.Argument, lowerTrials, upperTrials, strength.AtBound, true, mean.Value);
    }

    /// <summary>
    /// As <see cref="Choose"/>, with the indicators the kind's prior cannot explain set apart
    /// (<see cref="DistinctMembers"/>, prior share of distinct indicators <paramref name="distinctShare"/>): an
    /// indicator is set apart where π·BB(x | n, m·lower, (1 − m)·lower) &gt; (1 − π)·BB(x | n, m·s, (1 − m)·s), and m and s
    /// are chosen from the rest.
    /// </summary>
    public static ReliabilityPriorChoice ChooseSettingApart(
        double defaultRate, double priorStrength, IReadOnlyList<TrialRecord> indicators, double lowerTrials, double upperTrials, double distinctShare)
    {
        static double Log(TrialRecord r, double m, double s) => MarginalLikelihood.BetaBinomial(Math.Min(r.Errors, r.Trials), r.Trials, m * s, (1 - m) * s);
        var (choice, apart) = DistinctMembers.Choose(
            indicators,
            distinctShare,
            records => records.Any(r => r.Trials > 0) ? Choose(defaultRate, priorStrength, records, lowerTrials, upperTrials) : null,
            records => records.Any(r => r.Trials > 0) ? Choose(defaultRate, priorStrength, records, upperTrials, upperTrials) : null,
            (c, r) => Log(r, c.Mean, c.StrengthTrials),
            (c, r) => Log(r, c.Mean, lowerTrials));
        return choice with { SetApart = apart };
    }

    /// <summary>No choice by data: the configured mean and strength.</summary>
    public static ReliabilityPriorChoice Configured(double mean, double strengthTrials) =>
        new(mean, strengthTrials, strengthTrials, strengthTrials, false, false, 0);
}
