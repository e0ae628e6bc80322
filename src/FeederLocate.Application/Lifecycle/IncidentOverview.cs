using FeederLocate.Application.Analysis;
using FeederLocate.Application.Switching;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Lifecycle;

/// <summary>One incident as the board and the handover list show it.</summary>
/// <param name="Age">From the fault (its entered time, else the report) to now, or to the closing.</param>
/// <param name="CustomersOff">Customers on dead nodes at the switch positions of now; null when those give no radial network.</param>
/// <param name="CurrentStep">The first step not yet done, in words: of the return to normal once it has begun, else of the present switching order; null when none is left or there is no order.</param>
/// <param name="Interruption">Customer minutes interrupted from the steps' actual times, and the plan's estimates for the rest.</param>
public sealed record IncidentLine(IncidentState State, TimeSpan Age, int? CustomersOff, string? CurrentStep, CustomerInterruption? Interruption = null)
{
    /// <summary>
    /// <see cref="CurrentStep"/> as people read it: the action in plain words and segments by their sections' names
    /// (<see cref="Naming.StepWords"/>); the ids stay in <see cref="CurrentStep"/>, for the JSON and as a tooltip.
    /// </summary>
    public string? CurrentStepInWords { get; init; }

    public IncidentStage Stage => State.Stage;
}

/// <summary>The board's figures for an incident: its stage, its age, the customers still off, the current step and the customer minutes.</summary>
public static class IncidentOverview
{
    public static async Task<IncidentLine> LineAsync(NetworkGraph graph, IncidentState state, IncidentAnalysis analysis, DateTimeOffset now)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(state);
        ArgumentNullException.ThrowIfNull(analysis);
        var end = state.ClosedAt ?? now;
        var age = end - state.FaultAt;
        var plan = (await analysis.PlanAsync(graph, state).ConfigureAwait(false)).Plan;
        var back = state.HasOutcome ? (await analysis.ReturnAsync(graph, state).ConfigureAwait(false)).Plan : null;
        string? current = null;
        string? inWords = null;
        if (state.Status == IncidentStatus.Open)
        {
            if (back is not null && ReturnSwitching.NotYet(state) is null && ReturnSwitching.Remaining(state, back) is { Count: > 0 } left)
            {
                current = "return " + Describe(left[0]);
                inWords = "return " + Naming.StepWords.Describe(left[0], graph);
            }
            else if (plan is not null && plan.Steps.FirstOrDefault(s => !state.CompletedSteps.Any(d => d.Step.Order == s.Order && d.Step.Action == CheckedSwitching.ActionName(s.Action))) is { } step)
            {
                current = Describe(step);
                inWords = Naming.StepWords.Describe(step, graph);
            }
        }

        return new IncidentLine(state, age < TimeSpan.Zero ? TimeSpan.Zero : age, CustomersOff(graph, state), current,
            CustomerInterruption.Of(graph, state, plan, back, now))
        {
            CurrentStepInWords = inWords,
        };
    }

    /// <summary>A step by its number, action and device (or segments) in the plan document's words and ids, as the JSON gives it.</summary>
    public static string Describe(SwitchingStep step)
    {
        ArgumentNullException.ThrowIfNull(step);
        return $"{step.Order}. {CheckedSwitching.ActionName(step.Action)} {step.Device?.Value ?? string.Join(" ", step.Segments)}".TrimEnd();
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
