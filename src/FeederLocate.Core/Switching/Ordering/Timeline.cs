using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>A crew's trip to a device (or to the field indicators): who, from where, when it leaves.</summary>
/// <param name="Crew">The crew's label; null where the grid gives no crews (a crew of its own for every manual device).</param>
/// <param name="From">The device the crew leaves from; null for its base.</param>
/// <param name="After">The placement whose completion the crew leaves after; −1 when it leaves at the start.</param>
internal sealed record CrewTrip(string? Crew, SwitchId? From, TimeSpan Leaves, TimeSpan Travel, int After);

/// <summary>One operation on the timeline: its crew (null for the control room), its completion, the trip it needed.</summary>
internal sealed record Placement(string? Crew, TimeSpan Done, CrewTrip? Trip);

/// <summary>
/// The timeline of a plan. The steps follow one another (each starts when the one before it is done): the
/// control room carries out one switching operation at a time. Remote operations need no crew. A manual
/// operation needs a crew at its device: with the grid's crews, the crew that can start it first (the
/// earliest arrival, then the lowest in the list) goes there from its base or from its last device, taking
/// the device's travel time from its base; it stays there until its next trip. Without crews in the grid,
/// every manual device has a crew of its own that leaves at the start. Every crew leaves at minute 0.
/// </summary>
internal sealed class Timeline
{
    private readonly Grid _grid;
    private readonly SwitchingOptions _options;
    private readonly CrewBase[] _baseOf;
    private readonly string[] _labels;
    private readonly TimeSpan[] _free;
    private readonly int[] _at;
    private readonly int[] _last;
    private readonly Dictionary<int, (TimeSpan Free, int Last)> _ownCrews;
    private readonly List<Placement> _placements;

    public Timeline(Grid grid, SwitchingOptions options)
    {
        _grid = grid;
        _options = options;
        _baseOf = [.. grid.CrewBases.SelectMany(b => Enumerable.Repeat(b, b.Count))];
        _labels = [.. grid.CrewBases.SelectMany(b => b.CrewLabels)];
        _free = new TimeSpan[_labels.Length];
        _at = Enumerable.Repeat(NoDevice, _labels.Length).ToArray();
        _last = Enumerable.Repeat(-1, _labels.Length).ToArray();
        _ownCrews = [];
        _placements = [];
    }

    private Timeline(Timeline other)
    {
        _grid = other._grid;
        _options = other._options;
        _baseOf = other._baseOf;
        _labels = other._labels;
        _free = [.. other._free];
        _at = [.. other._at];
        _last = [.. other._last];
        _ownCrews = new(other._ownCrews);
        _placements = [.. other._placements];
        Now = other.Now;
    }

    private const int NoDevice = -1;

    public TimeSpan Now { get; private set; }

    /// <summary>True where the grid names its crews.</summary>
    public bool CrewsGiven => _labels.Length > 0;

    /// <summary>Every operation placed so far, in order.</summary>
    public IReadOnlyList<Placement> Placements => _placements;

    public Timeline Copy() => new(this);

    /// <summary>The device's own travel time (the grid's travelMinutes, or the default); zero for a remote device.</summary>
    public TimeSpan Travel(int device)
    {
        var d = _grid.Switches[device];
        return d.Remote ? TimeSpan.Zero : d.TravelTime is { } travel ? travel : _options.DefaultTravelTime;
    }

    /// <summary>Travel from a base to a device: the base's own time where it gives one, else the device's.</summary>
    public TimeSpan Travel(CrewBase from, int device) =>
        _grid.Switches[device].Remote ? TimeSpan.Zero : from.TravelTo(_grid.Switches[device].Id) ?? Travel(device);

    public TimeSpan Duration(StepAction action, int device) => action switch
    {
        StepAction.Replace => _options.FuseReplacementTime,
        StepAction.Verify => TimeSpan.Zero,
        _ => _grid.Switches[device].Remote ? _options.RemoteOperationTime : _options.ManualOperationTime,
    };

    /// <summary>Places one step on the timeline; returns its completion time.</summary>
    public TimeSpan Place(StepAction action, int device)
    {
        var index = _placements.Count;
        if (_grid.Switches[device].Remote)
        {
            Now += Duration(action, device);
            _placements.Add(new Placement(null, Now, null));
            return Now;
        }

        if (!CrewsGiven)
        {
            CrewTrip? trip = null;
            if (!_ownCrews.TryGetValue(device, out var own))
            {
                trip = new CrewTrip(null, null, TimeSpan.Zero, Travel(device), -1);
                own = (Travel(device), -1);
            }

            Now = Max(Now, own.Free) + Duration(action, device);
            _ownCrews[device] = (Now, index);
            _placements.Add(new Placement(null, Now, trip));
            return Now;
        }

        var best = -1;
        var bestArrival = TimeSpan.MaxValue;
        var bestStart = TimeSpan.MaxValue;
        for (var c = 0; c < _labels.Length; c++)
        {
            var arrival = _at[c] == device ? _free[c] : _free[c] + Travel(_baseOf[c], device);
            var start = Max(Now, arrival);
            if (start < bestStart || (start == bestStart && arrival < bestArrival))
            {
                (best, bestStart, bestArrival) = (c, start, arrival);
            }
        }

        var moved = _at[best] == device ? null : new CrewTrip(_labels[best], _at[best] >= 0 ? _grid.Switches[_at[best]].Id : null, _free[best], Travel(_baseOf[best], device), _last[best]);
        Now = bestStart + Duration(action, device);
        (_free[best], _at[best], _last[best]) = (Now, device, index);
        _placements.Add(new Placement(_labels[best], Now, moved));
        return Now;
    }

    /// <summary>
    /// A crew goes to read field indicators, <paramref name="travel"/> away, before the next step: the crew free
    /// first (a crew of its own without crews in the grid). Returns the placement, whose completion is the arrival.
    /// </summary>
    public Placement Visit(TimeSpan travel)
    {
        var index = _placements.Count;
        if (!CrewsGiven)
        {
            Now = Max(Now, travel);
            _placements.Add(new Placement(null, travel, new CrewTrip(null, null, TimeSpan.Zero, travel, -1)));
            return _placements[^1];
        }

        var best = 0;
        for (var c = 1; c < _labels.Length; c++)
        {
            best = _free[c] < _free[best] ? c : best;
        }

        var arrival = _free[best] + travel;
        var trip = new CrewTrip(_labels[best], _at[best] >= 0 ? _grid.Switches[_at[best]].Id : null, _free[best], travel, _last[best]);

        // The readings are written when the control room comes to them: the crew stays until then.
        Now = Max(Now, arrival);
        (_free[best], _at[best], _last[best]) = (Now, NoDevice, index);
        _placements.Add(new Placement(_labels[best], Now, trip));
        return _placements[^1];
    }

    /// <summary>
    /// The crew for the work at the isolated section: one standing at one of <paramref name="devices"/> if any,
    /// else the first in the list; null without crews in the grid.
    /// </summary>
    public string? WorkCrew(IEnumerable<int> devices)
    {
        if (!CrewsGiven)
        {
            return null;
        }

        var wanted = devices.ToHashSet();
        var c = Array.FindIndex(_at, wanted.Contains);
        return _labels[c >= 0 ? c : 0];
    }

    /// <summary>The crew standing at <paramref name="device"/> (the first in the list), or null.</summary>
    public string? CrewAt(int device)
    {
        var c = Array.IndexOf(_at, device);
        return c >= 0 ? _labels[c] : null;
    }

    private static TimeSpan Max(TimeSpan a, TimeSpan b) => a > b ? a : b;
}
