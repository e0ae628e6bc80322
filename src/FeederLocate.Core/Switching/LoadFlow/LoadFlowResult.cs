using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Result of a radial load flow, indexed as the grid's nodes, segments and substations. Dead nodes have
/// NaN voltage; dead segments carry 0 A.
/// </summary>
/// <param name="VoltagePu">Per node: |phase voltage| / (Un/√3) of its substation.</param>
/// <param name="SegmentCurrentA">Per segment: |phase current|, A.</param>
/// <param name="SubstationLoadMva">Per substation: |three-phase apparent power| out of its bus, MVA.</param>
/// <param name="Converged">False where the sweep did not settle (a voltage collapse): treat as infeasible.</param>
public sealed record LoadFlowResult(
    ImmutableArray<double> VoltagePu,
    ImmutableArray<double> SegmentCurrentA,
    ImmutableArray<double> SubstationLoadMva,
    bool Converged,
    int Iterations);
