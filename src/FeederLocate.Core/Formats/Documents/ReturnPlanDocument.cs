using FeederLocate.Core.Switching;

namespace FeederLocate.Core.Formats.Documents;

/// <summary>The <c>plan --return</c> document: the return-to-normal steps in the plan's step shape, the estimates, cautions and approximations.</summary>
public sealed record ReturnPlanDocument(
    IReadOnlyList<PlanDocument.StepEntry> Steps,
    int MostCustomersInterrupted,
    double CustomerMinutesInterrupted,
    IReadOnlyList<string> Cautions,
    IReadOnlyList<string> Approximations)
{
    public static ReturnPlanDocument From(ReturnPlan plan)
    {
        ArgumentNullException.ThrowIfNull(plan);
        return new(
            [.. plan.Steps.Select(PlanDocument.Step)],
            plan.MostCustomersInterrupted,
            Math.Round(plan.CustomerMinutesInterrupted, 1),
            plan.Cautions,
            plan.Approximations);
    }
}
