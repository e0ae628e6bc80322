using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Web.OneLine;

/// <summary>
/// Places a grid on the page: the node x/y hints when every node has them, otherwise a tree layout of
/// the normal-state radial network — depth from the bus across, leaves stacked down, each substation
/// below the last — with tie points drawn between the nodes they join.
/// </summary>
public static class OneLineLayout
{
    private const double Margin = 40;
    private const double HintScale = 60;
    private const double Column = 70;
    private const double Row = 42;

    public static OneLineDrawing Draw(NetworkGraph graph)
    {
        ArgumentNullException.ThrowIfNull(graph);
        var grid = graph.Grid;
        var fromHints = grid.Nodes.All(n => n.X is not null && n.Y is not null);
        var at = fromHints ? FromHints(grid) : TreeLayout(graph);
        var width = at.Values.Max(p => p.X) + Margin;
        var height = at.Values.Max(p => p.Y) + Margin;

        return new OneLineDrawing(
            [.. grid.Nodes.Select(n => new DrawnNode(n.Id, at[n.Id], n.Customers))],
            [.. grid.Segments.Select((s, i) => new DrawnSegment(s.Id, graph.Sections.OfSegment(i).Id, at[s.From], at[s.To], grid.LineTypeOf(s).Construction, s.LengthKm))],
            [.. grid.Switches.Select(s => new DrawnSwitch(s.Id, s.Kind, s.NormallyOpen, s.Remote, at[s.From], at[s.To]))],
            [.. grid.Indicators.Select(i =>
            {
                var segment = grid.Segment(i.Segment);
                var node = at[i.Node];
                var other = at[segment.From == i.Node ? segment.To : segment.From];
                return new DrawnIndicator(i.Id, i.Segment, i.Directional, i.Remote, node.Toward(other, 0.28), node.Toward(other, 0.5));
            })],
            [.. grid.Substations.Select(s => new DrawnSubstation(s.Id, s.BusNode, at[s.BusNode], GridFormat.Name(s.Grounding.Scheme)))],
            width,
            height,
            fromHints);
    }

    private static Dictionary<NodeId, DrawingPoint> FromHints(Grid grid)
    {
        var minX = grid.Nodes.Min(n => n.X!.Value);
        var maxY = grid.Nodes.Max(n => n.Y!.Value);

        // Hints have y upward; the page has it downward.
        return grid.Nodes.ToDictionary(
            n => n.Id,
            n => new DrawingPoint(Margin + ((n.X!.Value - minX) * HintScale), Margin + ((maxY - n.Y!.Value) * HintScale)));
    }

    private static Dictionary<NodeId, DrawingPoint> TreeLayout(NetworkGraph graph)
    {
        var grid = graph.Grid;
        var network = graph.Energise(SwitchStates.Normal(grid));
        var children = new List<int>[grid.Nodes.Length];
        for (var v = 0; v < children.Length; v++)
        {
            children[v] = [];
        }

        foreach (var v in network.FeedOrder)
        {
            if (network.ParentOf(v) is var p and >= 0)
            {
                children[p].Add(v);
            }
        }

        var at = new Dictionary<NodeId, DrawingPoint>();
        var nextRow = 0.0;
        foreach (var substation in grid.Substations)
        {
            var bus = grid.NodeIndex(substation.BusNode);
            Place(bus, 0);
            nextRow += 1;
        }

        // Dead nodes (fed from no bus): a row of their own at the bottom.
        var column = 0;
        foreach (var node in grid.Nodes.Where(n => !at.ContainsKey(n.Id)))
        {
            at[node.Id] = new DrawingPoint(Margin + (column++ * Column), Margin + (nextRow * Row));
        }

        return at;

        // Depth-first: a leaf takes the next row, a parent sits level with its first child.
        double Place(int v, int depth)
        {
            var row = nextRow;
            if (children[v].Count == 0)
            {
                nextRow += 1;
            }
            else
            {
                row = children[v].Select(c => Place(c, depth + 1)).First();
            }

            at[grid.Nodes[v].Id] = new DrawingPoint(Margin + (depth * Column), Margin + (row * Row));
            return row;
        }
    }
}
