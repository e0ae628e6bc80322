using System.Runtime.CompilerServices;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// The order of a ranking's list: most probable first, ties by id (ordinal). The ids' ordinal order is worked
/// out once per grid (segments) and per section map (sections), so ties compare integers, not strings; items
/// of probability 0 (segments passed over, most of them on a large grid) need no sorting at all, they follow
/// in id order.
/// </summary>
internal static class RankingOrder
{
    private static readonly ConditionalWeakTable<Grid, int[]> SegmentsById = [];
    private static readonly ConditionalWeakTable<SectionMap, int[]> SectionsById = [];

    /// <summary>Segment indices in ordinal order of their ids.</summary>
    public static int[] Segments(Grid grid) => SegmentsById.GetValue(grid, g =>
        [.. Enumerable.Range(0, g.Segments.Length).OrderBy(s => g.Segments[s].Id.Value, StringComparer.Ordinal)]);

    /// <summary>Section indices in ordinal order of their ids.</summary>
    public static int[] Sections(SectionMap sections) => SectionsById.GetValue(sections, m =>
        [.. Enumerable.Range(0, m.All.Length).OrderBy(s => m.All[s].Id.Value, StringComparer.Ordinal)]);

    /// <summary>
    /// The indices with a probability (<paramref name="probability"/> by index, NaN where absent), most probable
    /// first, ties in the order of <paramref name="byId"/>.
    /// </summary>
    public static List<int> Ranked(int[] byId, double[] probability)
    {
        var place = new int[byId.Length];
        for (var k = 0; k < byId.Length; k++)
        {
            place[byId[k]] = k;
        }

        var positive = new List<int>();
        var zero = new List<int>();
        foreach (var i in byId)
        {
            if (probability[i] > 0)
            {
                positive.Add(i);
            }
            else if (!double.IsNaN(probability[i]))
            {
                zero.Add(i);
            }
        }

        positive.Sort((a, b) => probability[a] != probability[b] ? probability[b].CompareTo(probability[a]) : place[a].CompareTo(place[b]));
        positive.AddRange(zero);
        return positive;
    }
}
