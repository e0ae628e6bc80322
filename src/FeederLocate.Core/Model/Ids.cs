namespace FeederLocate.Core.Model;

/// <summary>Id of a node (busbar, junction, load point) as written in the grid file.</summary>
public readonly record struct NodeId(string Value)
{
    public override string ToString() => Value;
}

/// <summary>Id of a line segment (cable or overhead line between two nodes).</summary>
public readonly record struct SegmentId(string Value)
{
    public override string ToString() => Value;
}

/// <summary>Id of a switching device (breaker, recloser, load-break switch, disconnector, fuse).</summary>
public readonly record struct SwitchId(string Value)
{
    public override string ToString() => Value;
}

/// <summary>Id of a fault passage indicator.</summary>
public readonly record struct IndicatorId(string Value)
{
    public override string ToString() => Value;
}

/// <summary>Id of a line type in the grid's catalogue.</summary>
public readonly record struct LineTypeId(string Value)
{
    public override string ToString() => Value;
}

/// <summary>Id of a substation (one MV busbar with its transformer and neutral).</summary>
public readonly record struct SubstationId(string Value)
{
    public override string ToString() => Value;
}

/// <summary>Id of a section: a maximal set of segments joined without crossing a switch.</summary>
public readonly record struct SectionId(string Value)
{
    public override string ToString() => Value;
}
