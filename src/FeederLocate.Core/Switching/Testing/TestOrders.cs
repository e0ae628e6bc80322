using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>Which test order a plan carries: the standing earth-fault search, trial closures for a split ranking, or none.</summary>
internal static class TestOrders
{
    public static ImmutableArray<TestEntry> For(PlanningContext ctx, IReadOnlyList<Suspect> suspects, ICollection<string> notes, out double? expectedReenergisations, out double? expectedInterruptions)
    {
        expectedReenergisations = null;
        expectedInterruptions = null;
        if (ctx.Ranking is null)
        {
            return [];
        }

        if (ctx.StandingEarthFault)
        {
            var search = EarthFaultSearch.Build(ctx, notes, out var expected);
            expectedInterruptions = search.IsEmpty ? null : expected;
            return search;
        }

        return suspects.Count >= 2 ? TrialClosures.Build(ctx, suspects, notes, out expectedReenergisations) : [];
    }
}
