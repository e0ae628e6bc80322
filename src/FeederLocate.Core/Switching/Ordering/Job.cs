using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>
/// One restoration in the order: the suspect boundary its island needs open, its cuts and its close;
/// <see cref="Customers"/> it restores; <see cref="After"/> the job that must come before it (the first
/// stage of a staged restoration), or null.
/// </summary>
internal sealed record Job(Candidate Candidate, ImmutableArray<PlannedOperation> Operations, int Customers, Job? After = null);
