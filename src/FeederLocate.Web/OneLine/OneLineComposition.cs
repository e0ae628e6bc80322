using FeederLocate.Core.Model;

namespace FeederLocate.Web.OneLine;

/// <summary>
/// What the view draws for one position and zoom: the suspects' percentages placed first, then the scene
/// of what is in view with the drawing's labels that would cover a percentage left out. Run on every pan
/// and zoom step, so it only looks at what is in view.
/// </summary>
public sealed record OneLineComposition(OneLineScene Scene, IReadOnlyList<DrawnLabel> SuspectLabels)
{
    /// <summary>How many suspects carry their percentage on the diagram.</summary>
    public const int LabelledSuspects = 5;

    public static OneLineComposition Of(
        OneLineDrawing drawing,
        OneLineViewport view,
        IReadOnlyDictionary<SectionId, double> sectionProbability,
        Func<SegmentId, bool> alwaysSegments)
    {
        ArgumentNullException.ThrowIfNull(drawing);
        ArgumentNullException.ThrowIfNull(view);
        ArgumentNullException.ThrowIfNull(sectionProbability);
        var scale = view.Scale;
        var visible = view.Visible;
        var suspects = sectionProbability
            .Where(p => p.Value >= 0.01)
            .OrderByDescending(p => p.Value)
            .Take(LabelledSuspects)
            .Select(p => (Text: Components.OneLine.DiagramSymbols.Percent(p.Value), OwnerId: p.Key.Value,
                Anchors: (IReadOnlyList<DrawingPoint>)[.. drawing.Segments.Where(s => s.Section == p.Key && s.Box.Overlaps(visible)).Select(s => s.Middle).Take(8)]))
            .Where(p => p.Anchors.Count > 0)
            .ToList();
        var suspectLabels = LabelPlacement.PlaceAtZoom(drawing, suspects, scale);
        var reserved = suspectLabels.Select(l => l.BoxAt(scale)).ToList();
        return new OneLineComposition(OneLineScene.Of(drawing, view, alwaysSegments, reserved), suspectLabels);
    }
}
