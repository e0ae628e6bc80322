using System.Collections.Immutable;
using System.Globalization;
using System.Text;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using static FeederLocate.Web.OneLine.OneLineGeometry;

namespace FeederLocate.Web.OneLine;

/// <summary>
/// Places a grid on the page as a schematic: each feeder of the normal state is an orthogonal tree hanging
/// from its substation's busbar (the deepest branch straight down, side branches to the right), feeders
/// stand side by side in rows so that the whole drawing keeps a screen-like shape, feeders joined by a tie
/// stand next to each other, and ties are drawn straight between the nodes they join. Node x/y hints in
/// the grid file are not used: the schematic is the same for every grid.
/// </summary>
public static class OneLineLayout
{
    private const double Margin = 60;
    private const double FeederGap = Column;
    private const double RowGap = Row * 1.5;

    /// <summary>Width over height the packing of feeders aims at.</summary>
    public const double TargetAspect = 1.6;

    public static OneLineDrawing Draw(NetworkGraph graph) => Draw(graph, FeederMap.Build(graph));

    public static OneLineDrawing Draw(NetworkGraph graph, FeederMap feeders)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(feeders);
        var grid = graph.Grid;
        var normal = feeders.Normal;
        var at = new DrawingPoint?[grid.Nodes.Length];
        var busY = new Dictionary<int, double>();   // head node → y of the bar it hangs from
        var children = Children(grid, normal);

        // Each feeder on its own: node offsets from the feeder's top-left corner, and its size.
        var local = feeders.All.Select(f => LayOut(f, children)).ToArray();
        var order = TieOrder(grid, feeders);

        // Shelf packing toward the target aspect: feeders left to right, a new row when too wide.
        var area = local.Sum(l => (l.Width + FeederGap) * (l.Height + RowGap));
        var rowWidth = Math.Max(local.Select(l => l.Width).DefaultIfEmpty(0).Max(), Math.Sqrt(area * TargetAspect));
        var (x, top, rowHeight) = (Margin, Margin, 0.0);
        var runs = new List<(int Substation, double Left, double Right, double Y)>();
        var drawnFeeders = new DrawnFeeder?[local.Length];
        foreach (var f in order)
        {
            var feeder = feeders.All[f];
            var layout = local[f];
            if (x > Margin && x + layout.Width > Margin + rowWidth)
            {
                (x, top, rowHeight) = (Margin, top + rowHeight + RowGap, 0.0);
            }

            var bar = top + (LabelGeometry.FontPx * 2);
            foreach (var (node, offset) in layout.Offsets)
            {
                at[node] = new DrawingPoint(x + offset.X, bar + offset.Y);
            }

            busY[feeder.Nodes[0]] = bar;
            var headX = at[feeder.Nodes[0]]!.Value.X;
            if (runs.Count > 0 && runs[^1].Substation == feeder.Substation && runs[^1].Y == bar)
            {
                runs[^1] = runs[^1] with { Right = headX + (Column / 2) };
            }
            else
            {
                runs.Add((feeder.Substation, headX - (Column / 2), headX + (Column / 2), bar));
            }

            drawnFeeders[f] = new DrawnFeeder(feeder.Name, feeder.HeadId, feeder.Substation,
                new DrawingBox(x, bar, x + layout.Width, bar + layout.Height), string.Empty);
            x += layout.Width + FeederGap;
            rowHeight = Math.Max(rowHeight, layout.Height + (bar - top));
        }

        // Buses: their first bar; nodes fed from nowhere: a row of their own below everything.
        var bottom = top + rowHeight + RowGap;
        foreach (var (substation, index) in grid.Substations.Select((s, i) => (s, i)))
        {
            var bus = grid.NodeIndex(substation.BusNode);
            var run = runs.FirstOrDefault(r => r.Substation == index);
            if (run == default)
            {
                runs.Add((index, Margin, Margin + Column, bottom));
                run = runs[^1];
                bottom += RowGap;
            }

            at[bus] = new DrawingPoint(run.Left, run.Y);
        }

        var column = 0;
        for (var v = 0; v < at.Length; v++)
        {
            if (at[v] is null)
            {
                at[v] = new DrawingPoint(Margin + (column++ * Column), bottom);
            }
        }

        var points = at.Select(p => p!.Value).ToArray();
        var segments = grid.Segments.Select((s, i) => new DrawnSegment(
            s.Id, graph.Sections.OfSegment(i).Id, FeederOfEdge(feeders, normal, grid.NodeIndex(s.From), grid.NodeIndex(s.To)),
            Route(normal, busY, points, grid.NodeIndex(s.From), grid.NodeIndex(s.To)), grid.LineTypeOf(s).Construction, s.LengthKm)).ToImmutableArray();
        var switches = grid.Switches.Select(s =>
        {
            var route = Route(normal, busY, points, grid.NodeIndex(s.From), grid.NodeIndex(s.To));
            var symbol = route.Length == 2 ? route[0].Toward(route[1], 0.5) : route[1].Toward(route[2], 0.5);
            return new DrawnSwitch(s.Id, s.Kind, s.NormallyOpen, s.Remote,
                s.NormallyOpen ? -1 : FeederOfEdge(feeders, normal, grid.NodeIndex(s.From), grid.NodeIndex(s.To)), route, symbol);
        }).ToImmutableArray();
        var indicators = grid.Indicators.Select(i =>
        {
            var segment = segments[grid.SegmentIndex(i.Segment)];
            var atStart = grid.NodeIndex(i.Node) == grid.NodeIndex(grid.Segment(i.Segment).From);

            // On the segment's vertical piece (the one that reaches the node below), a little way from the node.
            var route = segment.Points;
            var installed = atStart ? route[0] : route[^1];
            var other = atStart ? route[^1] : route[0];
            var (a, b) = (installed, other);
            if (route.Length == 3)
            {
                var child = route[0].X == route[1].X ? route[0] : route[2];
                (a, b) = installed == child ? (child, route[1]) : (route[1], child);
            }

            var length = Math.Abs(b.X - a.X) + Math.Abs(b.Y - a.Y);
            var near = length <= 0 ? 0.5 : Math.Min(0.5, (IndicatorRadius + 10) / length);
            return new DrawnIndicator(i.Id, i.Segment, i.Directional, i.Remote, a.Toward(b, near), a.Toward(b, Math.Min(0.9, near * 2)));
        }).ToImmutableArray();
        var substations = grid.Substations.Select((s, i) => new DrawnSubstation(s.Id, s.BusNode, points[grid.NodeIndex(s.BusNode)], GridFormat.Name(s.Grounding.Scheme),
            [.. runs.Where(r => r.Substation == i).Select(r => new DrawingBox(r.Left, r.Y - BusHalf, r.Right, r.Y + BusHalf))])).ToImmutableArray();

        var feederPaths = OverviewPaths(feeders.All.Length, segments, switches);
        var drawn = drawnFeeders.Select((d, f) => d! with { Path = feederPaths[f] }).ToImmutableArray();
        var width = points.Max(p => p.X) + Margin + (LabelGeometry.WidthPx(12));
        var height = points.Max(p => p.Y) + Margin;

        var obstacles = Obstacles(segments, switches, indicators, substations);
        var labels = LabelPlacement.Place(Candidates(grid, feeders, switches, indicators, substations), obstacles);
        return new OneLineDrawing(
            [.. grid.Nodes.Select((n, v) => new DrawnNode(n.Id, points[v], n.Customers))],
            segments, switches, indicators, substations, drawn, labels, width, height) { Obstacles = obstacles };
    }

    private static List<int>[] Children(Grid grid, EnergisedNetwork? normal)
    {
        var children = new List<int>[grid.Nodes.Length];
        for (var v = 0; v < children.Length; v++)
        {
            children[v] = [];
        }

        if (normal is not null)
        {
            foreach (var v in normal.FeedOrder)
            {
                if (normal.ParentOf(v) is var p and >= 0)
                {
                    children[p].Add(v);
                }
            }
        }

        return children;
    }

    /// <summary>
    /// One feeder as an orthogonal tree: every node one row below its parent; the child with the deepest
    /// subtree straight below it, the others in columns to the right, each leaf a column of its own.
    /// </summary>
    private static (List<(int Node, DrawingPoint Offset)> Offsets, double Width, double Height) LayOut(Feeder feeder, List<int>[] children)
    {
        var height = new Dictionary<int, int>();
        foreach (var v in feeder.Nodes.Reverse())
        {
            height[v] = children[v].Count == 0 ? 0 : 1 + children[v].Max(c => height[c]);
        }

        var offsets = new List<(int, DrawingPoint)>(feeder.Nodes.Length);
        var nextColumn = 0;
        var deepest = 0;

        // Depth-first with an explicit stack: a feeder can be thousands of nodes deep.
        var stack = new Stack<(int Node, int Depth, bool FirstChild)>();
        stack.Push((feeder.Nodes[0], 1, true));
        var columnOf = new Dictionary<int, int>();
        while (stack.Count > 0)
        {
            var (v, depth, first) = stack.Pop();
            if (!first)
            {
                nextColumn++;
            }

            columnOf[v] = nextColumn;
            deepest = Math.Max(deepest, depth);
            offsets.Add((v, new DrawingPoint((Column / 2) + (nextColumn * Column), depth * Row)));
            var ordered = children[v].OrderByDescending(c => height[c]).ToList();
            for (var k = ordered.Count - 1; k >= 0; k--)
            {
                stack.Push((ordered[k], depth + 1, k == 0));
            }
        }

        return (offsets, (nextColumn + 1) * Column, deepest * Row);
    }

    /// <summary>Feeders in an order that puts those joined by a tie next to each other, starting with the first.</summary>
    private static List<int> TieOrder(Grid grid, FeederMap feeders)
    {
        var neighbours = Enumerable.Range(0, feeders.All.Length).Select(_ => new SortedSet<int>()).ToArray();
        foreach (var tie in grid.Switches.Where(s => s.NormallyOpen))
        {
            var (a, b) = (feeders.FeederOf(grid.NodeIndex(tie.From)), feeders.FeederOf(grid.NodeIndex(tie.To)));
            if (a >= 0 && b >= 0 && a != b)
            {
                neighbours[a].Add(b);
                neighbours[b].Add(a);
            }
        }

        var placed = new bool[feeders.All.Length];
        var order = new List<int>(placed.Length);
        var last = -1;
        while (order.Count < placed.Length)
        {
            var next = last >= 0 ? neighbours[last].FirstOrDefault(n => !placed[n], -1) : -1;
            if (next < 0)
            {
                next = Array.IndexOf(placed, false);
            }

            placed[next] = true;
            order.Add(next);
            last = next;
        }

        return order;
    }

    /// <summary>
    /// The path of an edge: along its parent's row then straight down for an edge of the normal tree
    /// (straight down from the bar for a feeder's first edge), a straight line for any other.
    /// </summary>
    private static ImmutableArray<DrawingPoint> Route(EnergisedNetwork? normal, Dictionary<int, double> busY, DrawingPoint[] at, int a, int b)
    {
        if (normal is not null)
        {
            var (parent, child) = normal.ParentOf(b) == a ? (a, b) : normal.ParentOf(a) == b ? (b, a) : (-1, -1);
            if (child >= 0)
            {
                var (p, c) = (at[parent], at[child]);
                if (busY.TryGetValue(child, out var bar))
                {
                    return Ordered(parent == a, new DrawingPoint(c.X, bar), c);
                }

                return p.X == c.X
                    ? Ordered(parent == a, p, c)
                    : parent == a ? [p, new DrawingPoint(c.X, p.Y), c] : [c, new DrawingPoint(c.X, p.Y), p];
            }
        }

        return [at[a], at[b]];

        static ImmutableArray<DrawingPoint> Ordered(bool parentFirst, DrawingPoint p, DrawingPoint c) => parentFirst ? [p, c] : [c, p];
    }

    private static int FeederOfEdge(FeederMap feeders, EnergisedNetwork? normal, int a, int b)
    {
        var fa = feeders.FeederOf(a);
        var fb = feeders.FeederOf(b);
        return fa >= 0 && (fa == fb || fb < 0) ? fa : fb >= 0 && fa < 0 ? fb : normal is null ? -1 : fa == fb ? fa : -1;
    }

    private static string[] OverviewPaths(int feederCount, ImmutableArray<DrawnSegment> segments, ImmutableArray<DrawnSwitch> switches)
    {
        var paths = Enumerable.Range(0, feederCount).Select(_ => new StringBuilder()).ToArray();
        foreach (var (feeder, route) in segments.Select(s => (s.Feeder, s.Points)).Concat(switches.Select(s => (s.Feeder, s.Points))))
        {
            if (feeder < 0)
            {
                continue;
            }

            var path = paths[feeder];
            for (var k = 0; k < route.Length; k++)
            {
                path.Append(k == 0 ? 'M' : 'L')
                    .Append(Math.Round(route[k].X).ToString(CultureInfo.InvariantCulture)).Append(' ')
                    .Append(Math.Round(route[k].Y).ToString(CultureInfo.InvariantCulture));
            }
        }

        return [.. paths.Select(p => p.ToString())];
    }

    private static ObstacleIndex Obstacles(ImmutableArray<DrawnSegment> segments, ImmutableArray<DrawnSwitch> switches,
        ImmutableArray<DrawnIndicator> indicators, ImmutableArray<DrawnSubstation> substations)
    {
        var index = new ObstacleIndex();
        foreach (var route in segments.Select(s => s.Points).Concat(switches.Select(s => s.Points)))
        {
            for (var k = 0; k + 1 < route.Length; k++)
            {
                index.AddLine(route[k], route[k + 1], 2);
            }
        }

        foreach (var s in switches)
        {
            index.AddBox(DrawingBox.Around(s.At, SwitchHalf + 1, SwitchHalf + 1));
        }

        foreach (var i in indicators)
        {
            index.AddBox(DrawingBox.Around(i.At, IndicatorRadius + 1, IndicatorRadius + 1));
        }

        foreach (var bar in substations.SelectMany(s => s.Bars))
        {
            index.AddBox(bar);
        }

        return index;
    }

    private static List<LabelPlacement.Candidate> Candidates(Grid grid, FeederMap feeders, ImmutableArray<DrawnSwitch> switches,
        ImmutableArray<DrawnIndicator> indicators, ImmutableArray<DrawnSubstation> substations)
    {
        var heads = feeders.All.Where(f => f.Head.Kind == EdgeKind.Switch).Select(f => f.Head.Index).ToHashSet();
        var candidates = new List<LabelPlacement.Candidate>();
        foreach (var s in substations)
        {
            foreach (var bar in s.Bars)
            {
                // Left of each bar; it is wide and flat, so its "half size" is half its height.
                candidates.Add(new(s.Id.Value, LabelOwner.Substation, s.Id.Value, new DrawingPoint(bar.Left, bar.Centre.Y), BusHalf + 1, 0, [LabelSide.Left, LabelSide.Above]));
            }
        }

        foreach (var (s, k) in switches.Select((s, k) => (s, k)).OrderBy(p => heads.Contains(p.k) ? 0 : p.s.NormallyOpen ? 1 : 2))
        {
            candidates.Add(new(s.Id.Value, LabelOwner.Switch, s.Id.Value, s.At, SwitchHalf + 1, heads.Contains(k) ? 0 : SymbolScale, LabelPlacement.AllSides));
        }

        foreach (var i in indicators)
        {
            candidates.Add(new(i.Id.Value, LabelOwner.Indicator, i.Id.Value, i.At, IndicatorRadius + 1, SymbolScale, LabelPlacement.AllSides));
        }

        return candidates;
    }
}
