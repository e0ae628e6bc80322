namespace FeederLocate.Core.Switching;

/// <summary>
/// What a set of restorations is worth, compared lexicographically: restored customers first, then
/// restored nodes, then the fewest supplies other than the normal one (ties closed), then the fewest
/// operations. Sums of scores compare the same way, so a sum of upper bounds bounds a sum.
/// </summary>
internal readonly record struct RestorationScore(long Customers, long Nodes, long NormalFeedsLessTies, long FewerOperations)
    : IComparable<RestorationScore>
{
    public static RestorationScore Zero => default;

    public static RestorationScore Of(Candidate c) => new(c.Customers, c.Nodes, c.NormalFeed ? 0 : -1, -c.Operations.Length);

    public static RestorationScore operator +(RestorationScore a, RestorationScore b) =>
        new(a.Customers + b.Customers, a.Nodes + b.Nodes, a.NormalFeedsLessTies + b.NormalFeedsLessTies, a.FewerOperations + b.FewerOperations);

    public static bool operator <(RestorationScore a, RestorationScore b) => a.CompareTo(b) < 0;

    public static bool operator >(RestorationScore a, RestorationScore b) => a.CompareTo(b) > 0;

    public static bool operator <=(RestorationScore a, RestorationScore b) => a.CompareTo(b) <= 0;

    public static bool operator >=(RestorationScore a, RestorationScore b) => a.CompareTo(b) >= 0;

    public int CompareTo(RestorationScore other)
    {
        var c = Customers.CompareTo(other.Customers);
        if (c != 0)
        {
            return c;
        }

        c = Nodes.CompareTo(other.Nodes);
        if (c != 0)
        {
            return c;
        }

        c = NormalFeedsLessTies.CompareTo(other.NormalFeedsLessTies);
        return c != 0 ? c : FewerOperations.CompareTo(other.FewerOperations);
    }
}
