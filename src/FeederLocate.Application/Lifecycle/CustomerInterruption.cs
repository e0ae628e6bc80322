using FeederLocate.Application.Switching;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Lifecycle;

/// <summary>
/// The incident's customer minutes interrupted (IEEE 1366 CMI) as far as known: customers are off from the trip
/// (its entered time, else the fault's) until the switching that restored them, at each step's actual time where it
/// is done, at the plan's estimate where it is not (never earlier than now).
/// </summary>
/// <param name="From">The trip's time (else the fault's): where the count starts.</param>
/// <param name="Until">The last switching step counted (done or estimated), or now (the closing) when later.</param>
/// <param name="ActualSteps">Switching operations counted at their actual time.</param>
/// <param name="EstimatedSteps">Switching operations not done yet, counted at the plan's estimate.</param>
/// <param name="Basis">In words: which times the figure rests on.</param>
public sealed record CustomerInterruption(double CustomerMinutesInterrupted, DateTimeOffset From, DateTimeOffset Until, int ActualSteps, int EstimatedSteps, string Basis)
{
    /// <summary>The figure for <paramref name="state"/>, with the steps of its plan and its return order not done yet at their estimates.</summary>
    public static CustomerInterruption Of(NetworkGraph graph, IncidentState state, SwitchingPlan? plan, ReturnPlan? back, DateTimeOffset now) =>
        Of(graph, state, plan?.Steps ?? [], back?.Steps ?? [], now);

    /// <summary>
    /// The figure from the incident's switching as done, then <paramref name="planSteps"/> (whose <see cref="SwitchingStep.At"/>
    /// counts from the trip) and <paramref name="returnSteps"/> (counting from the repair, or from now while the repair
    /// is not reported) where not done yet.
    /// </summary>
    public static CustomerInterruption Of(NetworkGraph graph, IncidentState state, IReadOnlyList<SwitchingStep> planSteps, IReadOnlyList<SwitchingStep> returnSteps, DateTimeOffset now)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(state);
        ArgumentNullException.ThrowIfNull(planSteps);
        ArgumentNullException.ThrowIfNull(returnSteps);
        var grid = graph.Grid;
        var from = state.Times.TrippedAt ?? state.FaultAt;
        var end = state.ClosedAt ?? now;
        var actual = new List<(DateTimeOffset At, SwitchId Device, SwitchPosition Position)>();
        foreach (var deviation in state.Deviations)
        {
            actual.Add((deviation.RecordedAt, deviation.Deviation.Switch, deviation.Deviation.Position));
        }

        foreach (var done in state.EarlierSteps.Concat(state.CompletedSteps).Concat(state.ReturnSteps))
        {
            if (done.Step is { Device: { } device, Action: "open" or "close" })
            {
                actual.Add((done.DoneAt, new SwitchId(device), done.Step.Action == "close" ? SwitchPosition.Closed : SwitchPosition.Open));
            }
        }

        var estimated = new List<(DateTimeOffset At, SwitchId Device, SwitchPosition Position)>();
        var lastPlanned = end;
        foreach (var step in planSteps.Where(s => s is { ChangesNetwork: true, Device: not null } && !Done(state.CompletedSteps, s)))
        {
            var at = Later(from + step.At, end);
            lastPlanned = Later(lastPlanned, at);
            estimated.Add((at, step.Device!.Value, Position(step)));
        }

        var repairedAt = state.Stages.LastOrDefault(s => s.Stage == IncidentStage.Repaired)?.At ?? state.NoFaultFound?.LoggedAt;
        var returnFrom = Later(repairedAt ?? lastPlanned, lastPlanned);
        foreach (var step in returnSteps.Where(s => s is { ChangesNetwork: true, Device: not null } && !Done(state.ReturnSteps, s)))
        {
            estimated.Add((Later(returnFrom + step.At, end), step.Device!.Value, Position(step)));
        }

        var served = graph.TryEnergise(SwitchStates.Normal(grid), out var normal, out _) ? normal : null;
        var states = SwitchStates.AfterTrip(grid, state.Incident);
        var atStart = Off(graph, states, served) ?? 0;
        var changes = new List<SupplyChange>();
        var until = end;
        foreach (var (at, device, position) in actual.OrderBy(a => a.At).Concat(estimated.OrderBy(e => e.At)).Where(c => grid.HasSwitch(c.Device)))
        {
            states = states.With(device, position);
            var when = Later(at, from) - from;
            // A step whose positions give no radial network leaves the count as it was.
            if (Off(graph, states, served) is { } off)
            {
                changes.Add(new SupplyChange(changes.Count > 0 && when < changes[^1].At ? changes[^1].At : when, off));
            }

            until = Later(until, at);
        }

        var minutes = Core.Switching.CustomerMinutes.Interrupted(atStart, changes, until - from);
        var basis = $"from the {(state.Times.TrippedAt is null ? "fault" : "trip")} at {from.UtcDateTime.ToString("yyyy-MM-dd HH:mm 'UTC'", System.Globalization.CultureInfo.InvariantCulture)}: "
            + $"{actual.Count} switching operation{(actual.Count == 1 ? string.Empty : "s")} at the actual time{(actual.Count == 1 ? string.Empty : "s")}, "
            + $"{estimated.Count} at the plan's estimate"
            + (estimated.Count > 0 && repairedAt is null && returnSteps.Count > 0 ? " (the return counted as if the repair were reported now)" : string.Empty);
        return new CustomerInterruption(minutes, from, until, actual.Count, estimated.Count, basis);
    }

    private static DateTimeOffset Later(DateTimeOffset a, DateTimeOffset b) => a > b ? a : b;

    private static SwitchPosition Position(SwitchingStep step) => step.Action == StepAction.Close ? SwitchPosition.Closed : SwitchPosition.Open;

    private static bool Done(IEnumerable<CompletedPlanStep> done, SwitchingStep step) =>
        done.Any(d => d.Step.Order == step.Order && d.Step.Action == CheckedSwitching.ActionName(step.Action));

    /// <summary>Customers of the nodes the normal network supplies that have no supply at <paramref name="states"/>; null when not radial.</summary>
    private static int? Off(NetworkGraph graph, SwitchStates states, EnergisedNetwork? served)
    {
        if (!graph.TryEnergise(states, out var network, out _) || network is null)
        {
            return null;
        }

        var count = 0;
        for (var v = 0; v < graph.Grid.Nodes.Length; v++)
        {
            if ((served is null || served.IsEnergised(v)) && !network.IsEnergised(v))
            {
                count += graph.Grid.Nodes[v].Customers;
            }
        }

        return count;
    }
}
