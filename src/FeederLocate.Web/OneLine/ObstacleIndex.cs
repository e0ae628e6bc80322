namespace FeederLocate.Web.OneLine;

/// <summary>
/// Boxes and straight lines of the drawing in a uniform grid of cells, to ask quickly whether a label's
/// box would cover any of them.
/// </summary>
internal sealed class ObstacleIndex
{
    private const double Cell = 96;
    private readonly Dictionary<long, List<int>> _cells = [];
    private readonly List<DrawingBox> _boxes = [];
    private readonly List<(DrawingPoint A, DrawingPoint B, double HalfWidth)?> _lines = [];
    private int[] _seen = [];
    private int _stamp;

    public static ObstacleIndex Empty { get; } = new();

    public int Count => _boxes.Count;

    public void AddBox(DrawingBox box)
    {
        var id = _boxes.Count;
        _boxes.Add(box);
        _lines.Add(null);
        Insert(id, box);
    }

    /// <summary>A line of the given half width; an axis-parallel one is stored as its box.</summary>
    public void AddLine(DrawingPoint a, DrawingPoint b, double halfWidth)
    {
        var box = new DrawingBox(Math.Min(a.X, b.X), Math.Min(a.Y, b.Y), Math.Max(a.X, b.X), Math.Max(a.Y, b.Y)).Inflate(halfWidth);
        if (a.X == b.X || a.Y == b.Y)
        {
            AddBox(box);
            return;
        }

        var id = _boxes.Count;
        _boxes.Add(box);
        _lines.Add((a, b, halfWidth));

        // A slanted line: only the cells along it, in steps of half a cell.
        var steps = Math.Max(1, (int)Math.Ceiling(Math.Max(Math.Abs(b.X - a.X), Math.Abs(b.Y - a.Y)) / (Cell / 2)));
        for (var k = 0; k < steps; k++)
        {
            var p = a.Toward(b, k / (double)steps);
            var q = a.Toward(b, (k + 1) / (double)steps);
            Insert(id, new DrawingBox(Math.Min(p.X, q.X), Math.Min(p.Y, q.Y), Math.Max(p.X, q.X), Math.Max(p.Y, q.Y)).Inflate(halfWidth));
        }
    }

    /// <summary>True when <paramref name="box"/> overlaps any obstacle.</summary>
    public bool Hits(DrawingBox box)
    {
        if (_boxes.Count == 0)
        {
            return false;
        }

        if (_seen.Length < _boxes.Count)
        {
            Array.Resize(ref _seen, Math.Max(_boxes.Count, _seen.Length * 2));
        }

        _stamp++;
        var (x0, y0, x1, y1) = CellRange(box);
        for (var cx = x0; cx <= x1; cx++)
        {
            for (var cy = y0; cy <= y1; cy++)
            {
                if (!_cells.TryGetValue(Key(cx, cy), out var ids))
                {
                    continue;
                }

                foreach (var id in ids)
                {
                    if (_seen[id] == _stamp)
                    {
                        continue;
                    }

                    _seen[id] = _stamp;
                    if (!_boxes[id].Overlaps(box))
                    {
                        continue;
                    }

                    if (_lines[id] is not { } line || SegmentMeetsBox(line.A, line.B, box.Inflate(line.HalfWidth)))
                    {
                        return true;
                    }
                }
            }
        }

        return false;
    }

    private void Insert(int id, DrawingBox box)
    {
        var (x0, y0, x1, y1) = CellRange(box);
        for (var cx = x0; cx <= x1; cx++)
        {
            for (var cy = y0; cy <= y1; cy++)
            {
                var key = Key(cx, cy);
                if (!_cells.TryGetValue(key, out var ids))
                {
                    _cells[key] = ids = [];
                }

                if (ids.Count == 0 || ids[^1] != id)
                {
                    ids.Add(id);
                }
            }
        }
    }

    private static (int X0, int Y0, int X1, int Y1) CellRange(DrawingBox box) =>
        ((int)Math.Floor(box.Left / Cell), (int)Math.Floor(box.Top / Cell), (int)Math.Floor(box.Right / Cell), (int)Math.Floor(box.Bottom / Cell));

    private static long Key(int cx, int cy) => ((long)cx << 32) ^ (uint)cy;

    /// <summary>Liang–Barsky: does the segment a–b pass through the open box?</summary>
    private static bool SegmentMeetsBox(DrawingPoint a, DrawingPoint b, DrawingBox box)
    {
        var (t0, t1) = (0.0, 1.0);
        var (dx, dy) = (b.X - a.X, b.Y - a.Y);
        foreach (var (p, q) in new[] { (-dx, a.X - box.Left), (dx, box.Right - a.X), (-dy, a.Y - box.Top), (dy, box.Bottom - a.Y) })
        {
            if (p == 0)
            {
                if (q <= 0)
                {
                    return false;
                }

                continue;
            }

            var t = q / p;
            if (p < 0)
            {
                t0 = Math.Max(t0, t);
            }
            else
            {
                t1 = Math.Min(t1, t);
            }

            if (t0 >= t1)
            {
                return false;
            }
        }

        return true;
    }
}
