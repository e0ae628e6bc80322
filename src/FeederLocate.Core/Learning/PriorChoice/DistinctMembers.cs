using System.Collections.Immutable;

namespace FeederLocate.Core.Learning.PriorChoice;

/// <summary>
/// Sets apart the members of a group (the segments of a line type, the indicators of a kind) whose records
/// the group's prior cannot explain, so that one outlier does not decide how alike the others are.
/// </summary>
/// <remarks>
/// <para>One prior shared by a group is light-tailed: a single member failing five times as often as the rest
/// can only be fitted by a wide spread, i.e. a low strength, and then every ordinary member follows its own
/// few, noisy counts. The group is read instead as a mixture: each member is ordinary (the group's prior, mean
/// and strength chosen by empirical Bayes) with probability 1 − π, or distinct with probability π (a weak prior
/// at the group's mean and the lowest strength searched, so its own record decides).</para>
/// <para>The mixture is fitted by classification: a member is set apart where its posterior odds of being
/// distinct exceed one, π·P(record | weak prior) &gt; (1 − π)·P(record | group prior); the group's prior is then
/// chosen again from the members not set apart, and the test repeated until the set stops changing (at most
/// <see cref="Rounds"/> rounds). Distinct members are a minority by definition: at most (n − 1)/2 of n are set
/// apart, the least explained first.</para>
/// </remarks>
public static class DistinctMembers
{
    /// <summary>Rounds of choosing and testing; the set is usually stable after the second.</summary>
    public const int Rounds = 4;

    /// <summary>
    /// The choice from the members not set apart and the indices set apart. <paramref name="choose"/> chooses a
    /// prior from a list of records (null where they cannot choose one, e.g. no trials); <paramref name="alike"/>
    /// chooses the prior with every member alike (the strength at its upper bound), where the test starts, so that
    /// an outlier cannot hide behind the spread it causes; <paramref name="logOrdinary"/> and
    /// <paramref name="logDistinct"/> are a record's log marginal likelihood under the chosen prior and under the
    /// weak prior at its mean.
    /// </summary>
    public static (TChoice Choice, ImmutableArray<int> SetApart) Choose<TRecord, TChoice>(
        IReadOnlyList<TRecord> records,
        double distinctShare,
        Func<IReadOnlyList<TRecord>, TChoice?> choose,
        Func<IReadOnlyList<TRecord>, TChoice?> alike,
        Func<TChoice, TRecord, double> logOrdinary,
        Func<TChoice, TRecord, double> logDistinct)
        where TChoice : class
    {
        ArgumentNullException.ThrowIfNull(records);
        ArgumentNullException.ThrowIfNull(choose);
        ArgumentNullException.ThrowIfNull(alike);
        if (!(distinctShare is > 0 and < 0.5))
        {
            throw new ArgumentOutOfRangeException(nameof(distinctShare), distinctShare, "the share of distinct members must lie between 0 and 0.5");
        }

        TChoice All() => choose(records) ?? throw new ArgumentException("the records cannot choose a prior", nameof(records));
        var tested = alike(records) ?? All();
        var threshold = Math.Log((1 - distinctShare) / distinctShare);
        (TChoice Choice, ImmutableArray<int> SetApart)? result = null;
        for (var round = 0; round < Rounds; round++)
        {
            var current = tested;
            var next = Enumerable.Range(0, records.Count)
                .Select(i => (Index: i, Excess: logDistinct(current, records[i]) - logOrdinary(current, records[i])))
                .Where(m => m.Excess > threshold)
                .OrderByDescending(m => m.Excess)
                .Take((records.Count - 1) / 2)
                .Select(m => m.Index)
                .Order()
                .ToImmutableArray();
            if (result is { } found && next.SequenceEqual(found.SetApart))
            {
                break;
            }

            var ordinary = Enumerable.Range(0, records.Count).Where(i => !next.Contains(i)).Select(i => records[i]).ToList();
            if (next.IsEmpty || choose(ordinary) is not { } refitted)
            {
                result = (All(), []);
                break;
            }

            result = (refitted, next);
            tested = refitted;
        }

        return result ?? (All(), []);
    }
}
