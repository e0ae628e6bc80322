using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Topology;

/// <summary>
/// The position of every switching device at a moment: normal positions, then deviations.
/// Immutable; every change returns a new value.
/// </summary>
public sealed class SwitchStates
{
    private readonly ImmutableArray<bool> _closed;

    private SwitchStates(Grid grid, ImmutableArray<bool> closed)
    {
        Grid = grid;
        _closed = closed;
    }

    public Grid Grid { get; }

    /// <summary>True where the switch of that index is closed.</summary>
    internal ImmutableArray<bool> Closed => _closed;

    /// <summary>Every device in its normal position: ties open, all others closed.</summary>
    public static SwitchStates Normal(Grid grid)
    {
        ArgumentNullException.ThrowIfNull(grid);
        return new SwitchStates(grid, [.. grid.Switches.Select(s => !s.NormallyOpen)]);
    }

    /// <summary>
    /// The state at fault time and after protection acted: normal, then the incident's switchStates,
    /// then its tripped device open.
    /// </summary>
    public static SwitchStates AfterTrip(Grid grid, Incident incident)
    {
        ArgumentNullException.ThrowIfNull(incident);
        var states = AtFaultTime(grid, incident);
        return incident.TrippedDevice is { } tripped ? states.With(tripped, SwitchPosition.Open) : states;
    }

    /// <summary>Normal positions with the incident's deviations: the network the fault current flowed in.</summary>
    public static SwitchStates AtFaultTime(Grid grid, Incident incident)
    {
        ArgumentNullException.ThrowIfNull(incident);
        var states = Normal(grid);
        foreach (var (id, position) in incident.SwitchStates)
        {
            states = states.With(id, position);
        }

        return states;
    }

    public bool IsClosed(int switchIndex) => _closed[switchIndex];

    public bool IsClosed(SwitchId id) => _closed[Grid.SwitchIndex(id)];

    public SwitchPosition PositionOf(SwitchId id) => IsClosed(id) ? SwitchPosition.Closed : SwitchPosition.Open;

    public SwitchStates With(SwitchId id, SwitchPosition position) =>
        new(Grid, _closed.SetItem(Grid.SwitchIndex(id), position == SwitchPosition.Closed));

    /// <summary>The devices whose position differs from normal.</summary>
    public IReadOnlyDictionary<SwitchId, SwitchPosition> Deviations()
    {
        var deviations = new Dictionary<SwitchId, SwitchPosition>();
        for (var i = 0; i < _closed.Length; i++)
        {
            var device = Grid.Switches[i];
            if (_closed[i] == device.NormallyOpen)
            {
                deviations[device.Id] = _closed[i] ? SwitchPosition.Closed : SwitchPosition.Open;
            }
        }

        return deviations;
    }
}
