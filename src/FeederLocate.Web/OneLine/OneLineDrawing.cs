using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Web.OneLine;

/// <summary>A point of the drawing, in drawing units (pixels at zoom 1).</summary>
public readonly record struct DrawingPoint(double X, double Y)
{
    public DrawingPoint Toward(DrawingPoint other, double fraction) =>
        new(X + ((other.X - X) * fraction), Y + ((other.Y - Y) * fraction));
}

public sealed record DrawnNode(NodeId Id, DrawingPoint At, int Customers);

/// <summary>A segment drawn as an orthogonal polyline (two or three points) on its feeder (-1: on none).</summary>
public sealed record DrawnSegment(SegmentId Id, SectionId Section, int Feeder, ImmutableArray<DrawingPoint> Points, Construction Construction, double LengthKm)
{
    public DrawingPoint From => Points[0];

    public DrawingPoint To => Points[^1];

    public DrawingBox Box { get; } = DrawingBox.Of(Points);

    /// <summary>The middle of its longest piece: where a label about it goes.</summary>
    public DrawingPoint Middle => OneLineGeometry.MiddleOfLongestPiece(Points);
}

/// <summary>A switching device: its lead (the polyline between its nodes) and its symbol at <see cref="At"/>.</summary>
public sealed record DrawnSwitch(SwitchId Id, SwitchKind Kind, bool NormallyOpen, bool Remote, int Feeder, ImmutableArray<DrawingPoint> Points, DrawingPoint At)
{
    public DrawingPoint Middle => At;

    public DrawingPoint From => Points[0];

    public DrawingPoint To => Points[^1];

    public DrawingBox Box { get; } = DrawingBox.Of(Points).Union(DrawingBox.Around(At, OneLineGeometry.SwitchHalf, OneLineGeometry.SwitchHalf));
}

/// <summary>An indicator drawn on its segment a little way from the node it is installed at.</summary>
public sealed record DrawnIndicator(IndicatorId Id, SegmentId Segment, bool Directional, bool Remote, DrawingPoint At, DrawingPoint Looking);

/// <summary>A substation's busbar, drawn as one bar over each run of its feeders that sit side by side.</summary>
public sealed record DrawnSubstation(SubstationId Id, NodeId Bus, DrawingPoint At, string Scheme, ImmutableArray<DrawingBox> Bars);

/// <summary>A feeder's place in the drawing and its whole network as one path, for the overview.</summary>
public sealed record DrawnFeeder(string Name, string HeadId, int Substation, DrawingBox Box, string Path);

public enum LabelSide
{
    Right,
    Left,
    Above,
    Below,
}

/// <summary>What a label names.</summary>
public enum LabelOwner
{
    Substation,
    Switch,
    Indicator,

    /// <summary>A suspect section's probability, placed while the page runs.</summary>
    Suspect,
}

/// <summary>
/// A label of a symbol: drawn at a constant size on screen, on the given side of the symbol, from
/// <see cref="MinScale"/> (screen pixels per drawing unit) on; at that zoom and closer it overlaps no
/// other label, no symbol and no line.
/// </summary>
public sealed record DrawnLabel(string Text, LabelOwner Owner, string OwnerId, DrawingPoint Anchor, double SymbolHalf, LabelSide Side, double MinScale)
{
    /// <summary>The box the label takes at a zoom, in drawing units (see <see cref="LabelGeometry"/>).</summary>
    public DrawingBox BoxAt(double scale) => LabelGeometry.Box(Anchor, SymbolHalf, Side, Text.Length, scale);
}

/// <summary>The one-line diagram of a grid: where each element is drawn. Immutable; built once per grid.</summary>
public sealed record OneLineDrawing(
    ImmutableArray<DrawnNode> Nodes,
    ImmutableArray<DrawnSegment> Segments,
    ImmutableArray<DrawnSwitch> Switches,
    ImmutableArray<DrawnIndicator> Indicators,
    ImmutableArray<DrawnSubstation> Substations,
    ImmutableArray<DrawnFeeder> Feeders,
    ImmutableArray<DrawnLabel> Labels,
    double Width,
    double Height)
{
    /// <summary>Symbols, lines and labels, for placing labels added while the page runs (the suspects' percentages).</summary>
    internal ObstacleIndex Obstacles { get; init; } = ObstacleIndex.Empty;

    public DrawingBox Extent => new(0, 0, Width, Height);
}
