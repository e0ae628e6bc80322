using System.Collections.Immutable;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>How the suspect is isolated: the device that de-energises it if it is live, its boundary opens, and the state after.</summary>
/// <param name="BoundaryOpens">By switch index: the open of each closed boundary switch of the suspect.</param>
/// <param name="Points">The isolation points: switch index and its node on the suspect's side.</param>
/// <param name="Upstream">The boundary switch the suspect was fed through at fault time, or -1.</param>
internal sealed record IsolationResult(
    PlannedOperation? DeEnergise,
    ImmutableDictionary<int, PlannedOperation> BoundaryOpens,
    ImmutableArray<PlannedOperation> Verifies,
    ImmutableArray<(int Device, int Node)> Points,
    int Upstream,
    SwitchStates After,
    EnergisedNetwork AfterNetwork);
