using System.Collections.Immutable;

namespace FeederLocate.Web.OneLine;

/// <summary>
/// Decides, for every label, the side of its symbol it goes on and the zoom from which it shows. Zoom
/// levels are tried from the farthest to the closest (each a factor √2 apart); at each level the labels
/// not yet placed are tried in priority order on each side, and a label is placed where its box (at that
/// zoom) covers no symbol, no line and no label placed before it. Because a label's box only shrinks
/// toward its symbol as one zooms in, a label placed at one level fits at every closer one.
/// </summary>
public static class LabelPlacement
{
    /// <summary>The zooms tried, screen px per drawing unit: 1/32 to 4.</summary>
    public static ImmutableArray<double> Levels { get; } = [.. Enumerable.Range(-10, 15).Select(k => Math.Pow(2, k / 2.0))];

    public static readonly ImmutableArray<LabelSide> AllSides = [LabelSide.Right, LabelSide.Left, LabelSide.Above, LabelSide.Below];

    /// <summary>A label to place: its text, what it names, its symbol's centre and half size, the farthest zoom it may show at, its allowed sides.</summary>
    public sealed record Candidate(string Text, LabelOwner Owner, string OwnerId, DrawingPoint Anchor, double SymbolHalf, double FromScale, ImmutableArray<LabelSide> Sides);

    /// <summary>Places the candidates, given in priority order; those that fit at no level are left out.</summary>
    internal static ImmutableArray<DrawnLabel> Place(IReadOnlyList<Candidate> candidates, ObstacleIndex obstacles)
    {
        ArgumentNullException.ThrowIfNull(candidates);
        var placed = new DrawnLabel?[candidates.Count];
        foreach (var scale in Levels)
        {
            var labels = new ObstacleIndex();
            foreach (var label in placed)
            {
                if (label is not null)
                {
                    labels.AddBox(label.BoxAt(scale));
                }
            }

            for (var k = 0; k < candidates.Count; k++)
            {
                var c = candidates[k];
                if (placed[k] is not null || scale < c.FromScale)
                {
                    continue;
                }

                foreach (var side in c.Sides)
                {
                    var box = LabelGeometry.Box(c.Anchor, c.SymbolHalf, side, c.Text.Length, scale);
                    if (!obstacles.Hits(box) && !labels.Hits(box))
                    {
                        placed[k] = new DrawnLabel(c.Text, c.Owner, c.OwnerId, c.Anchor, c.SymbolHalf, side, scale);
                        labels.AddBox(box);
                        break;
                    }
                }
            }
        }

        return [.. placed.Where(p => p is not null).Select(p => p!)];
    }

    /// <summary>
    /// Places a few labels added while the page runs (the suspects' percentages) at one zoom: for each, the
    /// first of its anchors and sides where it covers nothing of the drawing and no label shown at that zoom.
    /// Gives the labels placed and the drawing's labels they would cover, which the view then hides.
    /// </summary>
    public static IReadOnlyList<DrawnLabel> PlaceAtZoom(OneLineDrawing drawing, IEnumerable<(string Text, string OwnerId, IReadOnlyList<DrawingPoint> Anchors)> extra, double scale)
    {
        ArgumentNullException.ThrowIfNull(drawing);
        ArgumentNullException.ThrowIfNull(extra);
        var placed = new List<DrawnLabel>();
        var taken = new ObstacleIndex();
        foreach (var (text, owner, anchors) in extra)
        {
            DrawnLabel? best = null;
            foreach (var anchor in anchors)
            {
                foreach (var side in AllSides)
                {
                    var box = LabelGeometry.Box(anchor, 3, side, text.Length, scale);
                    if (!drawing.Obstacles.Hits(box) && !taken.Hits(box))
                    {
                        best = new DrawnLabel(text, LabelOwner.Suspect, owner, anchor, 3, side, scale);
                        break;
                    }
                }

                if (best is not null)
                {
                    break;
                }
            }

            if (best is not null)
            {
                placed.Add(best);
                taken.AddBox(best.BoxAt(scale));
            }
        }

        return placed;
    }
}
