using System.Collections.Frozen;
using System.Collections.Immutable;

namespace FeederLocate.Core.Model;

/// <summary>
/// The master data of one MV network: catalogue, substations, nodes, segments, switching devices
/// and indicators, as loaded and validated. Immutable; the graph for a switching state is a view
/// built from it (see Topology.EnergisedNetwork).
/// </summary>
public sealed record Grid
{
    private readonly FrozenDictionary<LineTypeId, LineType> _lineTypes;
    private readonly FrozenDictionary<NodeId, int> _nodeIndex;
    private readonly FrozenDictionary<SegmentId, int> _segmentIndex;
    private readonly FrozenDictionary<SwitchId, int> _switchIndex;
    private readonly FrozenDictionary<IndicatorId, int> _indicatorIndex;
    private readonly FrozenDictionary<SubstationId, Substation> _substations;

    private Grid(
        string name,
        double frequencyHz,
        ImmutableArray<LineType> lineTypes,
        ImmutableArray<Substation> substations,
        ImmutableArray<Node> nodes,
        ImmutableArray<Segment> segments,
        ImmutableArray<SwitchingDevice> switches,
        ImmutableArray<Indicator> indicators)
    {
        Name = name;
        FrequencyHz = frequencyHz;
        LineTypes = lineTypes;
        Substations = substations;
        Nodes = nodes;
        Segments = segments;
        Switches = switches;
        Indicators = indicators;
        _lineTypes = lineTypes.ToFrozenDictionary(t => t.Id);
        _substations = substations.ToFrozenDictionary(s => s.Id);
        _nodeIndex = IndexOf(nodes, n => n.Id);
        _segmentIndex = IndexOf(segments, s => s.Id);
        _switchIndex = IndexOf(switches, s => s.Id);
        _indicatorIndex = IndexOf(indicators, i => i.Id);
    }

    /// <summary>
    /// Builds a grid from validated parts. Throws <see cref="ArgumentException"/> on duplicate ids;
    /// data from files goes through <see cref="Formats.GridReader"/>, which reports problems instead.
    /// </summary>
    public static Grid Create(
        string name,
        double frequencyHz,
        IEnumerable<LineType> lineTypes,
        IEnumerable<Substation> substations,
        IEnumerable<Node> nodes,
        IEnumerable<Segment> segments,
        IEnumerable<SwitchingDevice> switches,
        IEnumerable<Indicator> indicators)
    {
        ArgumentNullException.ThrowIfNull(name);
        if (frequencyHz is not (50 or 60))
        {
            throw new ArgumentOutOfRangeException(nameof(frequencyHz), frequencyHz, "frequency must be 50 or 60 Hz");
        }

        return new Grid(name, frequencyHz, [.. lineTypes], [.. substations], [.. nodes], [.. segments], [.. switches], [.. indicators]);
    }

    public string Name { get; }

    public double FrequencyHz { get; }

    public ImmutableArray<LineType> LineTypes { get; }

    public ImmutableArray<Substation> Substations { get; }

    public ImmutableArray<Node> Nodes { get; }

    public ImmutableArray<Segment> Segments { get; }

    public ImmutableArray<SwitchingDevice> Switches { get; }

    public ImmutableArray<Indicator> Indicators { get; }

    /// <summary>Where field crews set out from and how many; empty where the grid does not say (a crew is then assumed ready for every manual device).</summary>
    public ImmutableArray<CrewBase> CrewBases { get; private init; } = [];

    /// <summary>
    /// This grid with its crew bases. Throws <see cref="ArgumentException"/> on a duplicate id, an unknown node
    /// or device, a count below 1 or a negative travel time; data from files goes through the reader, which reports them.
    /// </summary>
    public Grid WithCrewBases(IEnumerable<CrewBase> bases)
    {
        ArgumentNullException.ThrowIfNull(bases);
        ImmutableArray<CrewBase> list = [.. bases];
        foreach (var b in list)
        {
            if (list.Count(o => o.Id == b.Id) > 1)
            {
                throw new ArgumentException($"duplicate crew base id {b.Id}", nameof(bases));
            }

            if (!HasNode(b.Node))
            {
                throw new ArgumentException($"crew base {b.Id}: unknown node {b.Node}", nameof(bases));
            }

            if (b.Count < 1)
            {
                throw new ArgumentException($"crew base {b.Id}: count must be at least 1, got {b.Count}", nameof(bases));
            }

            foreach (var (device, time) in b.TravelTimes ?? ImmutableDictionary<SwitchId, TimeSpan>.Empty)
            {
                if (!HasSwitch(device) || time < TimeSpan.Zero)
                {
                    throw new ArgumentException($"crew base {b.Id}: travel time to {device} names an unknown device or is negative", nameof(bases));
                }
            }
        }

        return this with { CrewBases = list };
    }

    /// <summary>Angular frequency ω = 2πf in rad/s.</summary>
    public double AngularFrequencyRadPerS => 2 * Math.PI * FrequencyHz;

    public LineType LineTypeOf(Segment segment) => _lineTypes[segment.LineType];

    public LineType LineType(LineTypeId id) => _lineTypes[id];

    public Substation Substation(SubstationId id) => _substations[id];

    public Node Node(NodeId id) => Nodes[_nodeIndex[id]];

    public Segment Segment(SegmentId id) => Segments[_segmentIndex[id]];

    public SwitchingDevice Switch(SwitchId id) => Switches[_switchIndex[id]];

    public Indicator Indicator(IndicatorId id) => Indicators[_indicatorIndex[id]];

    public int NodeIndex(NodeId id) => _nodeIndex[id];

    public int SegmentIndex(SegmentId id) => _segmentIndex[id];

    public int SwitchIndex(SwitchId id) => _switchIndex[id];

    public int IndicatorIndex(IndicatorId id) => _indicatorIndex[id];

    public bool HasNode(NodeId id) => _nodeIndex.ContainsKey(id);

    public bool HasSegment(SegmentId id) => _segmentIndex.ContainsKey(id);

    public bool HasSwitch(SwitchId id) => _switchIndex.ContainsKey(id);

    public bool HasIndicator(IndicatorId id) => _indicatorIndex.ContainsKey(id);

    private static FrozenDictionary<TId, int> IndexOf<T, TId>(ImmutableArray<T> items, Func<T, TId> id)
        where TId : notnull
    {
        var index = new Dictionary<TId, int>(items.Length);
        for (var i = 0; i < items.Length; i++)
        {
            if (!index.TryAdd(id(items[i]), i))
            {
                throw new ArgumentException($"duplicate id {id(items[i])}");
            }
        }

        return index.ToFrozenDictionary();
    }
}
