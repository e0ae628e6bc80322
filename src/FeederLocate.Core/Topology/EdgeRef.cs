namespace FeederLocate.Core.Topology;

public enum EdgeKind
{
    Segment,
    Switch,
}

/// <summary>An edge of the network graph: a segment or a switching device, by its index in the grid.</summary>
public readonly record struct EdgeRef(EdgeKind Kind, int Index)
{
    public static EdgeRef None => new(EdgeKind.Segment, -1);

    public bool IsNone => Index < 0;
}
