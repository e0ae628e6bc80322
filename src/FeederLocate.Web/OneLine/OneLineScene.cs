using FeederLocate.Core.Model;

namespace FeederLocate.Web.OneLine;

/// <summary>
/// The elements of the drawing a view shows: those whose box meets the view (with a margin), and the
/// labels legible and clear of each other at its zoom. Far out, feeders are whole paths without symbols.
/// </summary>
public sealed record OneLineScene(
    bool Overview,
    IReadOnlyList<DrawnFeeder> Feeders,
    IReadOnlyList<DrawnSegment> Segments,
    IReadOnlyList<DrawnSwitch> Switches,
    IReadOnlyList<DrawnIndicator> Indicators,
    IReadOnlyList<DrawnSubstation> Substations,
    IReadOnlyList<DrawnLabel> Labels)
{
    /// <summary>
    /// The scene of a view. In the overview only the segments in <paramref name="alwaysSegments"/> (dead or
    /// suspect: what the overview must still show) are drawn one by one, and ties; labels whose box would
    /// cover one in <paramref name="reserved"/> (the suspects' percentages) are left out.
    /// </summary>
    public static OneLineScene Of(OneLineDrawing drawing, OneLineViewport view, Func<SegmentId, bool>? alwaysSegments = null, IReadOnlyList<DrawingBox>? reserved = null)
    {
        ArgumentNullException.ThrowIfNull(drawing);
        ArgumentNullException.ThrowIfNull(view);
        var visible = view.Visible;
        var margin = visible.Inflate(Math.Max(visible.Width, visible.Height) * 0.05);
        var overview = view.Scale < OneLineGeometry.SymbolScale;
        var feeders = overview ? drawing.Feeders.Where(f => f.Box.Inflate(OneLineGeometry.Row).Overlaps(margin)).ToList() : [];
        var segments = drawing.Segments
            .Where(s => s.Box.Inflate(2).Overlaps(margin) && (!overview || s.Feeder < 0 || (alwaysSegments?.Invoke(s.Id) ?? false)))
            .ToList();
        var heads = overview ? drawing.Feeders.Select(f => f.HeadId).ToHashSet(StringComparer.Ordinal) : [];
        var switches = drawing.Switches
            .Where(s => s.Box.Overlaps(margin) && (!overview || s.NormallyOpen || s.Feeder < 0 || heads.Contains(s.Id.Value)))
            .ToList();
        var indicators = overview ? [] : drawing.Indicators.Where(i => margin.Overlaps(DrawingBox.Around(i.At, OneLineGeometry.IndicatorRadius, OneLineGeometry.IndicatorRadius))).ToList();
        var substations = drawing.Substations.Where(s => s.Bars.Any(b => b.Overlaps(margin))).ToList();
        var labels = drawing.Labels
            .Where(l => l.MinScale <= view.Scale && (!overview || l.Owner != LabelOwner.Indicator))
            .Where(l => l.BoxAt(view.Scale) is var box && box.Overlaps(margin) && (reserved is null || !reserved.Any(r => r.Overlaps(box))))
            .ToList();
        return new OneLineScene(overview, feeders, segments, switches, indicators, substations, labels);
    }
}
