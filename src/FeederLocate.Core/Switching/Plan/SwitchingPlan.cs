using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The switching order for an incident, assuming the fault lies in <see cref="IsolatedSections"/>:
/// steps from the incident's start state (normal, then its switch states, then the tripped device open),
/// safe at every step, leaving every isolated segment dead; the test order where the ranking is split or
/// a standing earth fault must be found; the cautions that always go with it.
/// </summary>
/// <param name="RestoredCustomers">Of the customers without supply at the start or cut off by the isolation, those supplied at the end.</param>
/// <param name="UnservedCustomers">Customers supplied at fault time and without supply at the end.</param>
/// <param name="CustomerMinutesInterrupted">IEEE 1366 CMI over the plan: Σ customers × minutes without supply, from the start to the last switching step.</param>
/// <param name="ExpectedReenergisationsOntoFault">Of the test order's trial closures; null when it has none.</param>
/// <param name="Approximations">What was assumed or approximated, in words.</param>
public sealed record SwitchingPlan(
    ImmutableArray<SwitchingStep> Steps,
    ImmutableArray<SectionId> IsolatedSections,
    ImmutableArray<PlanSection> Sections,
    double ColdLoadFactor,
    double VoltageLimitPu,
    int RestoredCustomers,
    int UnservedCustomers,
    double CustomerMinutesInterrupted,
    FinalSupply FinalSupply,
    ImmutableArray<TestEntry> TestOrder,
    double? ExpectedReenergisationsOntoFault,
    ImmutableArray<string> Cautions,
    ImmutableArray<string> Approximations)
{
    /// <summary>
    /// A standing earth fault with a split ranking: the earth-fault search of <see cref="TestOrder"/> comes first, and
    /// <see cref="Steps"/> (for the most likely section) are carried out only if the search ends at it.
    /// </summary>
    public bool SearchFirst { get; init; }

    /// <summary>How <see cref="ColdLoadFactor"/> was chosen, in words (the curve, the outage's duration).</summary>
    public string? ColdLoadBasis { get; init; }

    /// <summary>The cold-load curve the factor was read from; empty when a fixed factor was set.</summary>
    public ImmutableArray<ColdLoadPoint> ColdLoadCurve { get; init; } = [];

    /// <summary>Of the standing earth-fault search: the expected number of customer interruptions it causes; null without one.</summary>
    public double? ExpectedCustomerInterruptions { get; init; }
}

/// <summary>A section the plan names, with its segments.</summary>
public sealed record PlanSection(SectionId Id, ImmutableArray<SegmentId> Segments);
