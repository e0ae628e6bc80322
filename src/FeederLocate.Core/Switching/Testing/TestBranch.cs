using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// What to do after one result of a test entry.
/// </summary>
/// <param name="Result">The observation, e.g. "holds", "trips", "U0 stays", "U0 collapses".</param>
/// <param name="Then">Switching to do next, in words (devices named).</param>
/// <param name="Next">The test entry to go on with; null when the search ends here.</param>
/// <param name="FaultIn">Where the fault lies when the search ends here; empty when it goes on.</param>
public sealed record TestBranch(string Result, string Then, int? Next, ImmutableArray<SectionId> FaultIn);
