namespace FeederLocate.Web.OneLine;

/// <summary>
/// What part of the drawing is on screen: the drawing point at the middle of the view, the zoom (screen
/// pixels per drawing unit) and the view's size in screen pixels. Immutable; each step gives a new one.
/// </summary>
public sealed record OneLineViewport(DrawingPoint Centre, double Scale, double WidthPx, double HeightPx)
{
    /// <summary>The closest zoom: 4 screen px per drawing unit.</summary>
    public const double MaxScale = 4;

    /// <summary>Zoom step of the buttons and keys (the wheel takes half steps).</summary>
    public const double Step = 1.4142135623730951;

    public DrawingBox Visible => new(
        Centre.X - (WidthPx / 2 / Scale), Centre.Y - (HeightPx / 2 / Scale),
        Centre.X + (WidthPx / 2 / Scale), Centre.Y + (HeightPx / 2 / Scale));

    /// <summary>The farthest zoom allowed: the whole drawing, with room to spare.</summary>
    public static double MinScaleFor(OneLineDrawing drawing, double widthPx, double heightPx) =>
        Math.Min(widthPx / drawing.Width, heightPx / drawing.Height) * 0.8;

    /// <summary>A view of <paramref name="box"/> (with a margin), no closer than <paramref name="closest"/>.</summary>
    public static OneLineViewport Fit(OneLineDrawing drawing, DrawingBox box, double widthPx, double heightPx, double closest = 1.5)
    {
        ArgumentNullException.ThrowIfNull(drawing);
        var w = Math.Max(box.Width, OneLineGeometry.Column * 3) * 1.25;
        var h = Math.Max(box.Height, OneLineGeometry.Row * 3) * 1.25;
        var scale = Math.Clamp(Math.Min(widthPx / w, heightPx / h), MinScaleFor(drawing, widthPx, heightPx), Math.Min(closest, MaxScale));
        return new OneLineViewport(box.Centre, scale, widthPx, heightPx);
    }

    public static OneLineViewport Whole(OneLineDrawing drawing, double widthPx, double heightPx) =>
        new(drawing.Extent.Centre, Math.Min(widthPx / drawing.Width, heightPx / drawing.Height) * 0.95, widthPx, heightPx);

    /// <summary>Zoom by a factor keeping the drawing point under the screen point (x, y) where it is.</summary>
    public OneLineViewport ZoomAt(double factor, double xPx, double yPx, OneLineDrawing drawing)
    {
        ArgumentNullException.ThrowIfNull(drawing);
        var scale = Math.Clamp(Scale * factor, Math.Min(Scale, MinScaleFor(drawing, WidthPx, HeightPx)), MaxScale);
        var under = ToDrawing(xPx, yPx);
        var centre = new DrawingPoint(under.X - ((xPx - (WidthPx / 2)) / scale), under.Y - ((yPx - (HeightPx / 2)) / scale));
        return this with { Centre = centre, Scale = scale };
    }

    public OneLineViewport Zoom(double factor, OneLineDrawing drawing) => ZoomAt(factor, WidthPx / 2, HeightPx / 2, drawing);

    /// <summary>Move the drawing with the pointer by (dx, dy) screen pixels.</summary>
    public OneLineViewport PanBy(double dxPx, double dyPx) =>
        this with { Centre = new DrawingPoint(Centre.X - (dxPx / Scale), Centre.Y - (dyPx / Scale)) };

    public OneLineViewport CentreOn(DrawingPoint point) => this with { Centre = point };

    public OneLineViewport Resized(double widthPx, double heightPx) => this with { WidthPx = widthPx, HeightPx = heightPx };

    public DrawingPoint ToDrawing(double xPx, double yPx) =>
        new(Centre.X + ((xPx - (WidthPx / 2)) / Scale), Centre.Y + ((yPx - (HeightPx / 2)) / Scale));
}
