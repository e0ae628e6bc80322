namespace FeederLocate.Web.OneLine;

/// <summary>
/// The size of a label. Labels are drawn in a monospaced font of <see cref="FontPx"/> screen pixels
/// whatever the zoom, so in drawing units a label shrinks toward its symbol as one zooms in: a label that
/// fits at one zoom fits at every closer one.
/// </summary>
public static class LabelGeometry
{
    /// <summary>Label size on screen, px (legible: at least 11 px).</summary>
    public const double FontPx = 12;

    /// <summary>Advance of one character of the monospaced label font, in em (0.602 for DejaVu Sans Mono, 0.6 for Liberation Mono), with a margin.</summary>
    public const double CharEm = 0.62;

    /// <summary>Height taken by a line of text, in em (ascent plus descent, with a margin).</summary>
    public const double LineEm = 1.3;

    /// <summary>Gap between a symbol and its label, in em.</summary>
    public const double GapEm = 0.3;

    public static double WidthPx(int characters) => characters * CharEm * FontPx;

    public static DrawingBox Box(DrawingPoint anchor, double symbolHalf, LabelSide side, int characters, double scale)
    {
        var w = (WidthPx(characters) + (GapEm * FontPx)) / scale;
        var h = LineEm * FontPx / scale;
        var (x, y, r) = (anchor.X, anchor.Y, symbolHalf);
        return side switch
        {
            LabelSide.Right => new DrawingBox(x + r, y - (h / 2), x + r + w, y + (h / 2)),
            LabelSide.Left => new DrawingBox(x - r - w, y - (h / 2), x - r, y + (h / 2)),
            LabelSide.Above => new DrawingBox(x - (w / 2), y - r - h - (GapEm * FontPx / scale), x + (w / 2), y - r),
            _ => new DrawingBox(x - (w / 2), y + r, x + (w / 2), y + r + h + (GapEm * FontPx / scale)),
        };
    }
}
