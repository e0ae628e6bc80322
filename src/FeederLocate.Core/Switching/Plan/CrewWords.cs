using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>What a plan assumed about the crews, in words.</summary>
internal static class CrewWords
{
    public static string Assumption(Grid grid)
    {
        if (grid.CrewBases.IsEmpty)
        {
            return "crews: the grid names none, so a crew is assumed ready for every manual device, leaving at the start (the times are the earliest possible; give the grid's crews for times that wait for a busy crew)";
        }

        var bases = Words.List(grid.CrewBases.Select(b => $"{b.Count} at {b.Id}{(b.Name is { } n ? $" ({n})" : string.Empty)}"));
        var total = grid.CrewBases.Sum(b => b.Count);
        return $"crews: {total} from the grid ({bases}), leaving at the start; a crew does one step at a time and stays at its device until its next trip; the trip to a device takes the device's travel time from the crew's base, also from another device (the grid gives no times between devices), none to the device it is at; each manual step goes to the crew that can start it first; remote steps need no crew; the work at the isolated section (patrol, locks, proving dead, earths, permit) follows the last switching step and is not timed";
    }

    /// <summary>The reason of a dispatch to a manual device: the crew, where it comes from, how long the trip takes.</summary>
    public static string Dispatch(CrewTrip trip, SwitchId device)
    {
        var minutes = Words.Number(trip.Travel.TotalMinutes);
        return trip.Crew is null
            ? $"send a crew to {device} (manual; about {minutes} min to reach it)"
            : trip.After < 0
                ? $"send crew {trip.Crew} from its base to {device} (manual; about {minutes} min to reach it)"
                : $"crew {trip.Crew} goes on from {(trip.From is { } from ? from.Value : "the field indicators")} to {device} (manual; about {minutes} min to reach it)";
    }
}
