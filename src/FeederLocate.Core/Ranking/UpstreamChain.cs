using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// Links items kept at switching devices into one chain per node: an item is pushed at the far node of its
/// device, and each node's head continues its parent's, so walking the chain up from a node visits exactly the
/// items on the path from the source to it, nearest first.
/// </summary>
internal static class UpstreamChain
{
    /// <summary>Fills <paramref name="head"/> (one entry per node, -1 for none) and <paramref name="chain"/> from the items at each far node.</summary>
    public static void Link(EnergisedNetwork network, Dictionary<int, List<int>> atFarEnd, List<(int Item, int Next)> chain, int[] head)
    {
        Array.Fill(head, -1);
        foreach (var v in network.FeedOrder)
        {
            var link = network.ParentOf(v) is var parent and >= 0 ? head[parent] : -1;
            if (atFarEnd.TryGetValue(v, out var here))
            {
                foreach (var item in here)
                {
                    chain.Add((item, link));
                    link = chain.Count - 1;
                }
            }

            head[v] = link;
        }
    }
}
