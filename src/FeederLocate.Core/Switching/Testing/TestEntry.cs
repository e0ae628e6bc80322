using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// One entry of a test order: trial closures for a split ranking, or the sectioning search for a
/// standing earth fault while watching U0.
/// </summary>
/// <param name="Before">Operations on dead devices to make first, in order, in words (e.g. "open DS-2").</param>
/// <param name="Sections">The sections the action energises (trial close) or cuts off (open watching U0).</param>
/// <param name="FaultProbability">Probability, from the ranking, that the fault lies in <paramref name="Sections"/>.</param>
/// <param name="First">Branch after the first result: holds / U0 stays / U0 returns.</param>
/// <param name="Second">Branch after the other result: trips / U0 collapses / U0 stays absent.</param>
public sealed record TestEntry(
    int Order,
    TestAction Action,
    SwitchId Device,
    ImmutableArray<string> Before,
    ImmutableArray<SectionId> Sections,
    double FaultProbability,
    TestBranch First,
    TestBranch Second,
    string Reason);
