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

public sealed record DrawnSegment(SegmentId Id, SectionId Section, DrawingPoint From, DrawingPoint To, Construction Construction, double LengthKm);

public sealed record DrawnSwitch(SwitchId Id, SwitchKind Kind, bool NormallyOpen, bool Remote, DrawingPoint From, DrawingPoint To)
{
    public DrawingPoint Middle => From.Toward(To, 0.5);
}

/// <summary>An indicator drawn on its segment a little way from the node it is installed at.</summary>
public sealed record DrawnIndicator(IndicatorId Id, SegmentId Segment, bool Directional, bool Remote, DrawingPoint At, DrawingPoint Looking);

public sealed record DrawnSubstation(SubstationId Id, NodeId Bus, DrawingPoint At, string Scheme);

/// <summary>The one-line diagram of a grid: where each element is drawn. Immutable; built once per grid.</summary>
public sealed record OneLineDrawing(
    ImmutableArray<DrawnNode> Nodes,
    ImmutableArray<DrawnSegment> Segments,
    ImmutableArray<DrawnSwitch> Switches,
    ImmutableArray<DrawnIndicator> Indicators,
    ImmutableArray<DrawnSubstation> Substations,
    double Width,
    double Height,
    bool FromHints);
