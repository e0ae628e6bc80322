using System.Collections.Immutable;

namespace FeederLocate.Web.OneLine;

/// <summary>Sizes of the diagram's symbols and grid, in drawing units, and small helpers on polylines.</summary>
public static class OneLineGeometry
{
    /// <summary>Distance between two levels of a feeder's tree.</summary>
    public const double Row = 60;

    /// <summary>Distance between two branches side by side.</summary>
    public const double Column = 56;

    /// <summary>Half the side of a switch's square symbol.</summary>
    public const double SwitchHalf = 8;

    /// <summary>An indicator's circle radius.</summary>
    public const double IndicatorRadius = 8;

    /// <summary>Half the thickness of a busbar.</summary>
    public const double BusHalf = 4;

    /// <summary>Below this zoom (screen px per drawing unit) the view shows each feeder as one path, without symbols.</summary>
    public const double SymbolScale = 0.3;

    public static DrawingPoint MiddleOfLongestPiece(ImmutableArray<DrawingPoint> points)
    {
        var best = (A: points[0], B: points[^1], Length: -1.0);
        for (var k = 0; k + 1 < points.Length; k++)
        {
            var length = Math.Abs(points[k + 1].X - points[k].X) + Math.Abs(points[k + 1].Y - points[k].Y);
            if (length > best.Length)
            {
                best = (points[k], points[k + 1], length);
            }
        }

        return best.A.Toward(best.B, 0.5);
    }
}
