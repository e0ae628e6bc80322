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
        // The positive ones sorted on a key that orders them most probable first: a positive double's bits
        // grow with its value, so their complement falls with it. Equal keys are equal probabilities; their
        // places (the positions in byId) are put in order afterwards, so the sort needs no comparer.
        var keys = new ulong[byId.Length];
        var places = new int[byId.Length];
        var positive = 0;
        var zero = new List<int>();
        for (var k = 0; k < byId.Length; k++)
        {
            var p = probability[byId[k]];
            if (p > 0)
            {
                keys[positive] = ulong.MaxValue - (ulong)BitConverter.DoubleToInt64Bits(p);
                places[positive] = k;
                positive++;
            }
            else if (!double.IsNaN(p))
            {
                zero.Add(byId[k]);
            }
        }

        Array.Sort(keys, places, 0, positive);
        for (var start = 0; start < positive;)
        {
            var end = start + 1;
            while (end < positive && keys[end] == keys[start])
            {
                end++;
            }

            if (end - start > 1)
            {
                Array.Sort(places, start, end - start);
            }

            start = end;
        }

        var ranked = new List<int>(positive + zero.Count);
        for (var k = 0; k < positive; k++)
        {
            ranked.Add(byId[places[k]]);
        }

        ranked.AddRange(zero);
        return ranked;
    }
}
