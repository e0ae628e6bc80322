using System.Collections.Immutable;

namespace FeederLocate.Core.Learning.PriorChoice;

/// <summary>One segment's record for the choice of its line type's prior: faults k over exposure L·T.</summary>
public readonly record struct SegmentRecord(double Faults, double ExposureKmYears);

/// <summary>
/// The prior of a line type's segments chosen by empirical Bayes: each segment's rate λ ~ Gamma(μ·S, S),
/// μ the type-level rate (faults per km·year) and S its strength (km·years), both chosen to maximise
/// Σ log NB(k_s | μ·S, S, E_s) + E0·(r·ln μ − μ) over the type's segments. The last term is a weak
/// Gamma(r·E0, E0) belief in the stated rate r (on ln μ, so its mode is r): it keeps μ defined while
/// the type has few faults, and the data outweigh it once their exposure passes E0.
/// </summary>
/// <param name="MeanPerKmYear">μ: the type-level rate every segment shrinks toward, faults per km·year.</param>
/// <param name="StrengthKmYears">S: the km·years of a segment's own record that weigh as much as μ.</param>
/// <param name="LowerKmYears">The lower bound of S searched.</param>
/// <param name="UpperKmYears">The upper bound of S searched.</param>
/// <param name="AtBound">S lies on a bound: at the upper, the segments look alike (full pooling); at the lower, they differ as much as allowed.</param>
/// <param name="ChosenByData">False where there was nothing to choose from (no history, a type stated at 0): then S is the configured strength.</param>
/// <param name="LogMarginalLikelihood">The maximised objective (nats), 0 when not chosen by data.</param>
public sealed record FaultRatePriorChoice(
    double MeanPerKmYear,
    double StrengthKmYears,
    double LowerKmYears,
    double UpperKmYears,
    bool AtBound,
    bool ChosenByData,
    double LogMarginalLikelihood)
{
    /// <summary>μ in faults per 100 km·year, the unit of the grid file.</summary>
    public double MeanPer100KmYear => 100 * MeanPerKmYear;

    /// <summary>
    /// The segments (indices into the records chosen from) set apart as distinct by <see cref="ChooseSettingApart"/>:
    /// μ and S are chosen from the others, and these take the weak prior Gamma(μ·lower, lower). Empty otherwise.
    /// </summary>
    public ImmutableArray<int> SetApart { get; init; } = [];

    /// <summary>The strength of the prior of record <paramref name="index"/>: the lower bound where it is set apart, else S.</summary>
    public double StrengthOf(int index) => SetApart.Contains(index) ? LowerKmYears : StrengthKmYears;

    /// <summary>How far μ may move from the stated rate: a factor of this either way.</summary>
    public const double MeanRangeFactor = 50;

    /// <summary>
    /// Chooses μ and S for a type stated at <paramref name="statedPerKmYear"/> faults per km·year held with
    /// <paramref name="priorExposureKmYears"/> (E0), from its segments' records, S within the bounds.
    /// </summary>
    public static FaultRatePriorChoice Choose(
        double statedPerKmYear, double priorExposureKmYears, IReadOnlyList<SegmentRecord> segments, double lowerKmYears, double upperKmYears)
    {
        ArgumentNullException.ThrowIfNull(segments);
        if (!(statedPerKmYear > 0) || segments.All(s => s.ExposureKmYears == 0))
        {
            throw new ArgumentException("a choice needs a stated rate above 0 and some exposure");
        }

        var e0 = priorExposureKmYears;
        double Objective(double mu, double strength)
        {
            var sum = e0 * ((statedPerKmYear * Math.Log(mu)) - mu);
            foreach (var s in segments)
            {
                sum += MarginalLikelihood.GammaPoisson(s.Faults, s.ExposureKmYears, mu * strength, strength);
            }

            return sum;
        }

        BoundedMaximum BestMean(double strength) =>
            BoundedMaximiser.Maximise(mu => Objective(mu, strength), statedPerKmYear / MeanRangeFactor, statedPerKmYear * MeanRangeFactor);

        var strength = BoundedMaximiser.Maximise(s => BestMean(s).Value, lowerKmYears, upperKmYears);
        var mean = BestMean(strength.Argument);
        return new FaultRatePriorChoice(mean.Argument, strength.Argument, lowerKmYears, upperKmYears, strength.AtBound, true, mean.Value);
    }

    /// <summary>
    /// As <see cref="Choose"/>, with the segments the type's prior cannot explain set apart
    /// (<see cref="DistinctMembers"/>, prior share of distinct segments <paramref name="distinctShare"/>): a segment
    /// is set apart where π·NB(k | μ·lower, lower, E) &gt; (1 − π)·NB(k | μ·S, S, E), and μ and S are chosen from the rest.
    /// </summary>
    public static FaultRatePriorChoice ChooseSettingApart(
        double statedPerKmYear, double priorExposureKmYears, IReadOnlyList<SegmentRecord> segments, double lowerKmYears, double upperKmYears, double distinctShare)
    {
        var (choice, apart) = DistinctMembers.Choose(
            segments,
            distinctShare,
            records => records.Any(s => s.ExposureKmYears > 0) ? Choose(statedPerKmYear, priorExposureKmYears, records, lowerKmYears, upperKmYears) : null,
            records => records.Any(s => s.ExposureKmYears > 0) ? Choose(statedPerKmYear, priorExposureKmYears, records, upperKmYears, upperKmYears) : null,
            (c, s) => MarginalLikelihood.GammaPoisson(s.Faults, s.ExposureKmYears, c.MeanPerKmYear * c.StrengthKmYears, c.StrengthKmYears),
            (c, s) => MarginalLikelihood.GammaPoisson(s.Faults, s.ExposureKmYears, c.MeanPerKmYear * lowerKmYears, lowerKmYears));
        return choice with { SetApart = apart };
    }

    /// <summary>No choice by data: the configured mean and strength.</summary>
    public static FaultRatePriorChoice Configured(double meanPerKmYear, double strengthKmYears) =>
        new(meanPerKmYear, strengthKmYears, strengthKmYears, strengthKmYears, false, false, 0);
}
