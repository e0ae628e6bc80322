using FeederLocate.Application.Analysis;
using FeederLocate.Application.Switching;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Lifecycle;

/// <summary>One incident as the board and the handover list show it.</summary>
/// <param name="Age">From the fault (its entered time, else the report) to now, or to the closing.</param>
/// <param name="CustomersOff">Customers on dead nodes at the switch positions of now; null when those give no radial network.</param>
/// <param name="CurrentStep">The first step of the present switching order not yet done, in words; null when none is left or there is no order.</param>
public sealed record IncidentLine(IncidentState State, TimeSpan Age, int? CustomersOff, string? CurrentStep)
{
    public IncidentStage Stage => State.Stage;
}

/// <summary>The board's figures for an incident: its stage, its age, the customers still off, and the current step.</summary>
public static class IncidentOverview
{
    public static async Task<IncidentLine> LineAsync(NetworkGraph graph, IncidentState state, IncidentAnalysis analysis, DateTimeOffset now)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(state);
        ArgumentNullException.ThrowIfNull(analysis);
        var end = state.ClosedAt ?? now;
        var age = end - state.FaultAt;
        string? current = null;
        if (state.Status == IncidentStatus.Open && (await analysis.PlanAsync(graph, state).ConfigureAwait(false)).Plan is { } plan)
        {
            current = plan.Steps.FirstOrDefault(s => !state.CompletedSteps.Any(d => d.Step.Order == s.Order && d.Step.Action == CheckedSwitching.ActionName(s.Action))) is { } step
                ? $"{step.Order}. {CheckedSwitching.ActionName(step.Action)} {step.Device?.Value ?? string.Join(" ", step.Segments)}".TrimEnd()
                : null;
        }

        return new IncidentLine(state, age < TimeSpan.Zero ? TimeSpan.Zero : age, CustomersOff(graph, state), current);
    }

    /// <summary>Customers on nodes without supply at the incident's switch positions of now.</summary>
    public static int? CustomersOff(NetworkGraph graph, IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(graph);
        if (!graph.TryEnergise(IncidentSwitching.Current(graph.Grid, state), out var network, out _) || network is null)
        {
            return null;
        }

        return graph.Grid.Nodes.Where(n => !network.IsEnergised(n.Id)).Sum(n => n.Customers);
    }
}
