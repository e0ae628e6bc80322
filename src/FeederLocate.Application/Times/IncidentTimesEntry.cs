using FeederLocate.Application.Incidents;
using FeederLocate.Application.Switching;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Times;

/// <summary>
/// The operator gives the incident's fault, trip and reclosure times. None may be in the future; the trip and the
/// reclosure not before the fault, the reclosure not before the trip; the fault not after a reading already
/// entered. A refusal names the time and the rule; nothing is logged then.
/// </summary>
public sealed class IncidentTimesEntry(IncidentLog log, TimeProvider clock)
{
    public StepDecision Enter(IncidentId id, DateTimeOffset? faultAt, DateTimeOffset? trippedAt, DateTimeOffset? reclosedAt, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(actor);
        if (faultAt is null && trippedAt is null && reclosedAt is null)
        {
            return StepDecision.Refused("give at least one of the fault, trip and reclosure times");
        }

        var state = log.State(id);
        var now = clock.GetUtcNow();
        var fault = faultAt ?? state.Times.FaultAt;
        var trip = trippedAt ?? state.Times.TrippedAt;
        var problem = (faultAt is { } f ? EventTimes.Problem("faultAt", f, (DateTimeOffset?)null, now) : null)
            ?? (trippedAt is { } t ? EventTimes.Problem("trippedAt", t, fault, now) : null)
            ?? (reclosedAt is { } r ? EventTimes.Problem("reclosedAt", r, trip ?? fault, now, trip is null ? "the fault began" : "the trip") : null)
            ?? EarliestReadingBefore(state, fault);
        if (problem is not null)
        {
            return StepDecision.Refused(problem);
        }

        log.Append(id, new IncidentTimesEntered(faultAt, trippedAt, reclosedAt), actor);
        return StepDecision.Logged;
    }

    private static string? EarliestReadingBefore(IncidentState state, DateTimeOffset? fault) =>
        fault is { } at && state.Incident.Indications.Where(i => i.ReadAt < at).MinBy(i => i.ReadAt) is { } early
            ? $"faultAt {EventTimes.Text(at)} is after the reading of {early.Indicator} at {EventTimes.Text(early.ReadAt!.Value)}"
            : null;
}
