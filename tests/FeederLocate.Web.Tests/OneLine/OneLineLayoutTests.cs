using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;
using FeederLocate.Web.OneLine;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.OneLine;

public class OneLineLayoutTests
{
    public static TheoryData<string> Samples => new() { "solid", "resonant", "isolated", "impedance" };

    private static OneLineDrawing Sample(string scheme) => LoadedGrids.Sample(scheme).Drawing;

    private static OneLineDrawing Generated(int segments, GroundingScheme scheme, int substations, int seed) =>
        OneLineLayout.Draw(new NetworkGraph(SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed, scheme, Substations: substations))));

    [Theory]
    [MemberData(nameof(Samples))]
    public void Every_line_of_a_feeder_runs_across_or_down(string scheme)
    {
        var drawing = Sample(scheme);

        AssertOrthogonal(drawing);
    }

    [Theory]
    [MemberData(nameof(Samples))]
    public void No_label_of_a_sample_grid_covers_another_label_a_symbol_or_a_line(string scheme) =>
        AssertLabelsClear(Sample(scheme));

    [Fact]
    public void The_breakers_of_the_sample_grid_are_labelled_at_the_zoom_it_opens_on()
    {
        var drawing = Sample("solid");

        foreach (var breaker in new[] { "CB-A1", "CB-A2", "CB-B1", "CB-B2" })
        {
            var label = Assert.Single(drawing.Labels, l => l.OwnerId == breaker);
            Assert.True(label.MinScale <= 1, $"{breaker} shows from zoom {label.MinScale}");
        }
    }

    [Theory]
    [InlineData(10_000, GroundingScheme.Resonant, 2, 1)]
    [InlineData(3_000, GroundingScheme.Isolated, 3, 5)]
    [InlineData(800, GroundingScheme.Solid, 1, 9)]
    [InlineData(2_000, GroundingScheme.Impedance, 4, 3)]
    public void A_generated_grid_lays_out_as_orthogonal_feeders_side_by_side_in_a_screen_like_shape(int segments, GroundingScheme scheme, int substations, int seed)
    {
        var drawing = Generated(segments, scheme, substations, seed);

        AssertOrthogonal(drawing);
        var aspect = drawing.Width / drawing.Height;
        Assert.InRange(aspect, 0.5, 4);

        // Feeders do not overlap one another.
        var boxes = drawing.Feeders.Select(f => f.Box).ToList();
        for (var a = 0; a < boxes.Count; a++)
        {
            for (var b = a + 1; b < boxes.Count; b++)
            {
                Assert.False(boxes[a].Overlaps(boxes[b]), $"feeders {drawing.Feeders[a].Name} and {drawing.Feeders[b].Name} overlap");
            }
        }

        // No two nodes on the same spot (buses excepted: a bus is drawn as bars).
        var buses = drawing.Substations.Select(s => s.Bus).ToHashSet();
        var spots = drawing.Nodes.Where(n => !buses.Contains(n.Id)).GroupBy(n => n.At).Where(g => g.Count() > 1).Select(g => string.Join(", ", g.Select(n => n.Id)));
        Assert.Empty(spots);
    }

    [Theory]
    [InlineData(10_000, GroundingScheme.Resonant, 2, 1)]
    [InlineData(2_500, GroundingScheme.Solid, 3, 4)]
    public void No_label_of_a_generated_grid_covers_another_label_a_symbol_or_a_line(int segments, GroundingScheme scheme, int substations, int seed)
    {
        var drawing = Generated(segments, scheme, substations, seed);

        AssertLabelsClear(drawing);

        // Most devices get a label at the closest zoom.
        Assert.True(drawing.Labels.Length > 0.8 * (drawing.Switches.Length + drawing.Indicators.Length),
            $"{drawing.Labels.Length} labels for {drawing.Switches.Length} switches and {drawing.Indicators.Length} indicators");
    }

    private static void AssertOrthogonal(OneLineDrawing drawing)
    {
        foreach (var s in drawing.Segments)
        {
            for (var k = 0; k + 1 < s.Points.Length; k++)
            {
                Assert.True(s.Points[k].X == s.Points[k + 1].X || s.Points[k].Y == s.Points[k + 1].Y, $"segment {s.Id} is slanted");
            }
        }

        foreach (var s in drawing.Switches.Where(s => !s.NormallyOpen))
        {
            Assert.All(s.Points.Zip(s.Points.Skip(1)), p => Assert.True(p.First.X == p.Second.X || p.First.Y == p.Second.Y, $"switch {s.Id} is slanted"));
        }
    }

    /// <summary>
    /// Checked pair by pair, independently of the placement's own index: two labels at the closer of their two
    /// first zooms (a label only shrinks toward its symbol as one zooms in), a label and a symbol or an
    /// axis-parallel line at the label's first zoom.
    /// </summary>
    private static void AssertLabelsClear(OneLineDrawing drawing)
    {
        var labels = drawing.Labels;
        Assert.NotEmpty(labels);
        Assert.Equal(labels.Length, labels.Select(l => l.OwnerId + "|" + l.Anchor).Distinct().Count());
        var symbols = drawing.Switches.Select(s => (Id: s.Id.Value, Box: DrawingBox.Around(s.At, OneLineGeometry.SwitchHalf, OneLineGeometry.SwitchHalf)))
            .Concat(drawing.Indicators.Select(i => (Id: i.Id.Value, Box: DrawingBox.Around(i.At, OneLineGeometry.IndicatorRadius, OneLineGeometry.IndicatorRadius))))
            .Concat(drawing.Substations.SelectMany(s => s.Bars.Select(b => (Id: s.Id.Value, Box: b))))
            .ToList();
        var lines = drawing.Segments.SelectMany(s => Pieces(s.Id.Value, s.Points))
            .Concat(drawing.Switches.Where(s => !s.NormallyOpen).SelectMany(s => Pieces(s.Id.Value, s.Points)))
            .ToList();

        var order = labels.OrderBy(l => l.BoxAt(l.MinScale).Left).ToArray();
        for (var a = 0; a < order.Length; a++)
        {
            var widest = order[a].BoxAt(order[a].MinScale);
            for (var b = a + 1; b < order.Length && order[b].BoxAt(order[b].MinScale).Left < widest.Right; b++)
            {
                var scale = Math.Max(order[a].MinScale, order[b].MinScale);
                Assert.False(order[a].BoxAt(scale).Overlaps(order[b].BoxAt(scale)),
                    $"labels {order[a].Text} and {order[b].Text} overlap from zoom {scale}");
            }
        }

        foreach (var label in labels)
        {
            var box = label.BoxAt(label.MinScale);
            Assert.DoesNotContain(symbols, s => s.Box.Overlaps(box));
            Assert.DoesNotContain(lines, l => l.Box.Overlaps(box));
        }
    }

    private static IEnumerable<(string Id, DrawingBox Box)> Pieces(string id, System.Collections.Immutable.ImmutableArray<DrawingPoint> points) =>
        points.Zip(points.Skip(1)).Select(p => (id, DrawingBox.Of([p.First, p.Second]).Inflate(1)));
}

public class OneLineSceneTests
{
    private static readonly OneLineDrawing Large = OneLineLayout.Draw(new NetworkGraph(SyntheticGrid.Generate(new SyntheticGridOptions(10_000, Seed: 2))));

    [Theory]
    [InlineData(0.05)]
    [InlineData(0.4)]
    [InlineData(1)]
    [InlineData(3)]
    public void A_view_holds_only_elements_that_meet_it_and_labels_legible_at_its_zoom(double scale)
    {
        var view = new OneLineViewport(Large.Extent.Centre, scale, 1200, 700);

        var scene = OneLineScene.Of(Large, view);

        var around = view.Visible.Inflate(Math.Max(view.Visible.Width, view.Visible.Height) * 0.1);
        Assert.All(scene.Segments, s => Assert.True(s.Box.Overlaps(around), $"{s.Id} is out of view"));
        Assert.All(scene.Switches, s => Assert.True(s.Box.Overlaps(around), $"{s.Id} is out of view"));
        Assert.All(scene.Labels, l => Assert.True(l.MinScale <= scale, $"{l.Text} shows from {l.MinScale}"));
        Assert.True(scene.Segments.Count + scene.Switches.Count + scene.Indicators.Count < 2_500,
            $"{scene.Segments.Count} segments, {scene.Switches.Count} switches, {scene.Indicators.Count} indicators at zoom {scale}");
    }

    [Fact]
    public void Zooming_at_a_point_keeps_the_drawing_under_it()
    {
        var view = new OneLineViewport(new DrawingPoint(500, 400), 0.5, 1000, 600);

        var zoomed = view.ZoomAt(2, 200, 100, Large);

        var before = view.ToDrawing(200, 100);
        var after = zoomed.ToDrawing(200, 100);
        Assert.Equal(before.X, after.X, 6);
        Assert.Equal(before.Y, after.Y, 6);
        Assert.Equal(1, zoomed.Scale, 6);
    }
}
