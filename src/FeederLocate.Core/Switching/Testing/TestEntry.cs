using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// One entry of a test order: switching steps of the same shape as the plan's, then an observation,
/// then a branch per result. Entries run from the incident's start state; each entry's steps follow
/// the steps of the entry whose branch named it.
/// </summary>
/// <param name="Entry">Its number; branches name the next one by it.</param>
/// <param name="Steps">Open and close steps in order (numbered from 1 within the entry; <see cref="SwitchingStep.At"/> counts from the start of the incident along the branches that lead here).</param>
/// <param name="ReenergisesSections">The suspect sections this entry puts voltage on (a trial closure, or a reclosure onto the dead part of a standing earth-fault search).</param>
/// <param name="FaultProbability">This entry's own probability, from the ranking, that it re-energises onto the fault (trial closure, reclosure) or that the part it cuts off holds it (an open watching U0).</param>
/// <param name="Reason">Why this entry, in words.</param>
public sealed record TestEntry(
    int Entry,
    ImmutableArray<SwitchingStep> Steps,
    TestObservation Observe,
    ImmutableArray<SectionId> ReenergisesSections,
    ImmutableArray<SectionId> CutsOffSections,
    double FaultProbability,
    ImmutableArray<TestBranch> Branches,
    string Reason);
