using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>What follows one result of a test entry.</summary>
/// <param name="Result">The observation: holds, trips, U0 stays, U0 collapses, U0 returns, U0 stays absent.</param>
/// <param name="FaultIn">The suspect sections where the fault lies after this result, most likely first.</param>
/// <param name="Next">The entry to go on with; null when the test order ends here (then follow the plan for <paramref name="FaultIn"/>).</param>
/// <param name="Then">What to do next, in words.</param>
public sealed record TestBranch(TestResult Result, ImmutableArray<SectionId> FaultIn, int? Next, string Then);

/// <summary>What an entry watches after its steps.</summary>
public enum TestObservation
{
    /// <summary>Does the breaker or recloser hold, or trip?</summary>
    Trip,

    /// <summary>Does the neutral voltage U0 of the network clear, stay or return?</summary>
    NeutralVoltage,
}

/// <summary>The result a branch follows.</summary>
public enum TestResult
{
    Holds,
    Trips,
    U0Stays,
    U0Collapses,
    U0Returns,
    U0StaysAbsent,
}
