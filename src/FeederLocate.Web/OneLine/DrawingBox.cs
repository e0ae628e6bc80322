namespace FeederLocate.Web.OneLine;

/// <summary>An axis-aligned rectangle of the drawing, in drawing units (y downward).</summary>
public readonly record struct DrawingBox(double Left, double Top, double Right, double Bottom)
{
    public double Width => Right - Left;

    public double Height => Bottom - Top;

    public DrawingPoint Centre => new((Left + Right) / 2, (Top + Bottom) / 2);

    public static DrawingBox Around(DrawingPoint p, double halfWidth, double halfHeight) =>
        new(p.X - halfWidth, p.Y - halfHeight, p.X + halfWidth, p.Y + halfHeight);

    public static DrawingBox Of(IEnumerable<DrawingPoint> points)
    {
        var (l, t, r, b) = (double.MaxValue, double.MaxValue, double.MinValue, double.MinValue);
        foreach (var p in points)
        {
            (l, t, r, b) = (Math.Min(l, p.X), Math.Min(t, p.Y), Math.Max(r, p.X), Math.Max(b, p.Y));
        }

        return new DrawingBox(l, t, r, b);
    }

    /// <summary>True when the two share area (touching edges do not count).</summary>
    public bool Overlaps(DrawingBox other) =>
        Left < other.Right && other.Left < Right && Top < other.Bottom && other.Top < Bottom;

    public DrawingBox Inflate(double by) => new(Left - by, Top - by, Right + by, Bottom + by);

    public DrawingBox Union(DrawingBox other) =>
        new(Math.Min(Left, other.Left), Math.Min(Top, other.Top), Math.Max(Right, other.Right), Math.Max(Bottom, other.Bottom));
}
