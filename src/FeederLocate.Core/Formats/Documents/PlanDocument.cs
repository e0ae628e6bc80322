using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;

namespace FeederLocate.Core.Formats.Documents;

/// <summary>The <c>plan</c> document: the contract's fields first, then the estimates, cautions and approximations.</summary>
public sealed record PlanDocument(
    IReadOnlyList<PlanDocument.StepEntry> Steps,
    IReadOnlyList<string> IsolatedSections,
    IReadOnlyList<PlanDocument.SectionEntry> Sections,
    double ColdLoadFactor,
    int RestoredCustomers,
    int UnservedCustomers,
    IReadOnlyList<PlanDocument.TestEntryDocument> TestOrder,
    double? ExpectedReenergisationsOntoFault,
    double VoltageLimitPu,
    double CustomerMinutesInterrupted,
    PlanDocument.FinalStateEntry FinalState,
    PlanDocument.RankingEntry Ranking,
    IReadOnlyList<string> Cautions,
    IReadOnlyList<string> Approximations,
    bool SearchFirst,
    double? ExpectedCustomerInterruptions,
    string? ColdLoadBasis,
    IReadOnlyList<PlanDocument.ColdLoadPointEntry> ColdLoadCurve)
{
    public static PlanDocument From(SwitchingPlan plan, RankingResult ranking) => new(
        [.. plan.Steps.Select(Step)],
        [.. plan.IsolatedSections.Select(s => s.Value)],
        [.. plan.Sections.Select(s => new SectionEntry(s.Id.Value, [.. s.Segments.Select(x => x.Value)]))],
        plan.ColdLoadFactor,
        plan.RestoredCustomers,
        plan.UnservedCustomers,
        [.. plan.TestOrder.Select(TestEntryDocument.From)],
        plan.ExpectedReenergisationsOntoFault,
        plan.VoltageLimitPu,
        Math.Round(plan.CustomerMinutesInterrupted, 1),
        new FinalStateEntry(
            Math.Round(plan.FinalSupply.MinimumVoltagePu, 4), plan.FinalSupply.MinimumVoltageNode?.Value,
            Math.Round(plan.FinalSupply.MaximumLoadingPercent, 1), plan.FinalSupply.MaximumLoadingSegment?.Value),
        new RankingEntry(ranking.Consistent, ranking.Sections.IsDefaultOrEmpty ? null : ranking.Sections[0].Id.Value,
            ranking.Sections.IsDefaultOrEmpty ? 0 : ranking.Sections[0].Probability),
        plan.Cautions,
        plan.Approximations,
        plan.SearchFirst,
        plan.ExpectedCustomerInterruptions is { } e ? Math.Round(e, 2) : null,
        plan.ColdLoadBasis,
        [.. plan.ColdLoadCurve.Select(p => new ColdLoadPointEntry(p.Outage.TotalMinutes, p.Factor))]);

    /// <summary>One point of the cold-load curve: the outage in minutes and the multiplier.</summary>
    public sealed record ColdLoadPointEntry(double OutageMinutes, double Factor);

    /// <summary>The contract's action names: camelCase of the core's.</summary>
    public static string ActionName(StepAction action) => char.ToLowerInvariant(action.ToString()[0]) + action.ToString()[1..];

    /// <summary>The contract's observation names.</summary>
    public static string ObservationName(TestObservation observation) => observation == TestObservation.Trip ? "trip" : "neutralVoltage";

    /// <summary>The contract's result names: camelCase of the core's.</summary>
    public static string ResultName(TestResult result) => char.ToLowerInvariant(result.ToString()[0]) + result.ToString()[1..];

    internal static StepEntry Step(SwitchingStep s) => new(
        s.Order, ActionName(s.Action), s.Device?.Value, s.Node?.Value,
        s.Segments.IsDefaultOrEmpty ? null : [.. s.Segments.Select(x => x.Value)],
        Math.Round(s.At.TotalMinutes, 2), s.Reason, s.Crew);

    /// <param name="AtMinutes">Planned completion, minutes after the start (for a dispatch, when the crew leaves).</param>
    /// <param name="Crew">The crew that carries the step out (<c>DEPOT/1</c>); absent for the control room, or where the grid names no crews.</param>
    public sealed record StepEntry(int Order, string Action, string? Device, string? Node, IReadOnlyList<string>? Segments, double AtMinutes, string Reason, string? Crew = null);

    public sealed record SectionEntry(string Id, IReadOnlyList<string> Segments);

    /// <summary>One branch: the result, where the fault lies then, and the entry to go on with (written as null where the test order ends).</summary>
    public sealed record BranchEntry(
        string Result,
        IReadOnlyList<string> FaultIn,
        [property: System.Text.Json.Serialization.JsonIgnore(Condition = System.Text.Json.Serialization.JsonIgnoreCondition.Never)] int? Next,
        string Then)
    {
        public static BranchEntry From(TestBranch b) => new(ResultName(b.Result), [.. b.FaultIn.Select(s => s.Value)], b.Next, b.Then);
    }

    /// <summary>One test entry as the contract gives it: steps of the plan's shape, the observation, the branches.</summary>
    public sealed record TestEntryDocument(
        int Entry,
        IReadOnlyList<StepEntry> Steps,
        string Observe,
        IReadOnlyList<string> ReenergisesSections,
        IReadOnlyList<string>? CutsOffSections,
        double FaultProbability,
        IReadOnlyList<BranchEntry> Branches,
        string Reason)
    {
        public static TestEntryDocument From(TestEntry e) => new(
            e.Entry,
            [.. e.Steps.Select(Step)],
            ObservationName(e.Observe),
            [.. e.ReenergisesSections.Select(s => s.Value)],
            e.CutsOffSections.IsDefaultOrEmpty ? null : [.. e.CutsOffSections.Select(s => s.Value)],
            e.FaultProbability,
            [.. e.Branches.Select(BranchEntry.From)],
            e.Reason);
    }

    public sealed record FinalStateEntry(double MinimumVoltagePu, string? MinimumVoltageNode, double MaximumLoadingPercent, string? MaximumLoadingSegment);

    public sealed record RankingEntry(bool Consistent, string? TopSection, double TopProbability);
}
