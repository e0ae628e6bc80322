using System.Collections.Immutable;

namespace FeederLocate.Core.Comparison;

/// <summary>What happened to an element between two grids.</summary>
public enum ElementChangeKind
{
    Added,
    Removed,
    Changed,
}

/// <summary>One field whose value differs, by the grid format's name (nested fields joined with a dot); null where absent.</summary>
public sealed record FieldChange(string Field, string? Before, string? After);

/// <summary>An element added, removed or changed, by the grid format's collection (<c>segments</c>, <c>switches</c>, …) and id.</summary>
public sealed record ElementChange(string Collection, string Id, ElementChangeKind Change, ImmutableArray<FieldChange> Fields)
{
    /// <summary>The element kind in the singular, as issues name it: segment, switch, indicator, node, substation, line type, crew base.</summary>
    public string Kind => GridDifference.KindOf(Collection);
}

/// <summary>
/// The differences between two grids: the grid's own fields (name, frequency) and every element added, removed or
/// changed, by kind and id, with the changed fields. Empty when the grids are the same element by element.
/// </summary>
public sealed record GridDifference(ImmutableArray<FieldChange> GridFields, ImmutableArray<ElementChange> Elements)
{
    /// <summary>The grid format's collections, in the order they are compared and listed.</summary>
    public static readonly ImmutableArray<string> Collections = ["substations", "nodes", "segments", "switches", "indicators", "lineTypes", "crews"];

    public bool IsEmpty => GridFields.IsEmpty && Elements.IsEmpty;

    public IEnumerable<ElementChange> Added => Elements.Where(e => e.Change == ElementChangeKind.Added);

    public IEnumerable<ElementChange> Removed => Elements.Where(e => e.Change == ElementChangeKind.Removed);

    public IEnumerable<ElementChange> Changed => Elements.Where(e => e.Change == ElementChangeKind.Changed);

    public static string KindOf(string collection) => collection switch
    {
        "substations" => "substation",
        "nodes" => "node",
        "segments" => "segment",
        "switches" => "switch",
        "indicators" => "indicator",
        "lineTypes" => "line type",
        "crews" => "crew base",
        _ => collection,
    };
}
