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
    IReadOnlyList<string> Approximations)
{
    public static PlanDocument From(SwitchingPlan plan, RankingResult ranking) => new(
        [.. plan.Steps.Select(s => new StepEntry(
            s.Order, ActionName(s.Action), s.Device?.Value, s.Node?.Value,
            s.Segments.IsDefaultOrEmpty ? null : [.. s.Segments.Select(x => x.Value)],
            Math.Round(s.At.TotalMinutes, 2), s.Reason))],
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
        plan.Approximations);

    /// <summary>The contract's action names: camelCase of the core's.</summary>
    public static string ActionName(StepAction action) => action switch
    {
        StepAction.ProveDead => "proveDead",
        _ => action.ToString().ToLowerInvariant(),
    };

    public static string ActionName(TestAction action) => action switch
    {
        TestAction.TrialClose => "trialClose",
        TestAction.OpenWatchingU0 => "openWatchingU0",
        _ => "closeWatchingU0",
    };

    public sealed record StepEntry(int Order, string Action, string? Device, string? Node, IReadOnlyList<string>? Segments, double AtMinutes, string Reason);

    public sealed record SectionEntry(string Id, IReadOnlyList<string> Segments);

    public sealed record BranchEntry(string Result, string Then, int? Next, IReadOnlyList<string>? FaultIn)
    {
        public static BranchEntry From(TestBranch b) =>
            new(b.Result, b.Then, b.Next, b.FaultIn.IsDefaultOrEmpty ? null : [.. b.FaultIn.Select(s => s.Value)]);
    }

    /// <summary>One test entry; the branch fields present depend on the action.</summary>
    public sealed record TestEntryDocument(
        int Order,
        string Action,
        string Device,
        IReadOnlyList<string> Before,
        IReadOnlyList<string>? Energises,
        IReadOnlyList<string>? CutsOff,
        double FaultProbability,
        BranchEntry? IfHolds,
        BranchEntry? IfTrips,
        BranchEntry? IfU0Stays,
        BranchEntry? IfU0Collapses,
        BranchEntry? IfU0Returns,
        BranchEntry? IfU0StaysAbsent,
        string Reason)
    {
        public static TestEntryDocument From(TestEntry e)
        {
            var sections = e.Sections.Select(s => s.Value).ToList();
            var first = BranchEntry.From(e.First);
            var second = BranchEntry.From(e.Second);
            return e.Action switch
            {
                TestAction.TrialClose => new(e.Order, ActionName(e.Action), e.Device.Value, e.Before, sections, null, e.FaultProbability, first, second, null, null, null, null, e.Reason),
                TestAction.OpenWatchingU0 => new(e.Order, ActionName(e.Action), e.Device.Value, e.Before, null, sections, e.FaultProbability, null, null, first, second, null, null, e.Reason),
                _ => new(e.Order, ActionName(e.Action), e.Device.Value, e.Before, sections, null, e.FaultProbability, null, null, null, null, first, second, e.Reason),
            };
        }
    }

    public sealed record FinalStateEntry(double MinimumVoltagePu, string? MinimumVoltageNode, double MaximumLoadingPercent, string? MaximumLoadingSegment);

    public sealed record RankingEntry(bool Consistent, string? TopSection, double TopProbability);
}
