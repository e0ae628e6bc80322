using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>The groups chosen for restoration and the final state's supply verdict.</summary>
internal sealed record RestorationResult(ImmutableArray<Candidate> Chosen, SupplyVerdict? Verdict);
