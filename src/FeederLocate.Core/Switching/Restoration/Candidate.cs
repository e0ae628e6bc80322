using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>
/// One way to restore part of the dead area: close <see cref="Source"/> onto a connected group of zones
/// of one island, with the switches between the group and the rest of the island open.
/// </summary>
/// <param name="Source">The switch that closes (index); for a disconnector or fuse, closed dead under a load-break device opened briefly.</param>
/// <param name="Donor">The substation that takes the group on.</param>
/// <param name="FeederHead">The node below the donor's bus that heads the feeder taking the group on.</param>
/// <param name="Zones">The zones restored.</param>
/// <param name="Cuts">Switches opened inside the island so that only the group is picked up.</param>
/// <param name="Nodes">Nodes restored.</param>
/// <param name="NormalFeed">True where the source is the device the area is normally fed through (the feeder head).</param>
/// <param name="Operations">The operations, in order: cuts, then the source's procedure.</param>
internal sealed record Candidate(
    int Source,
    int Donor,
    int FeederHead,
    int Island,
    ImmutableArray<int> Zones,
    ImmutableArray<int> Cuts,
    int Customers,
    int Nodes,
    bool NormalFeed,
    ImmutableArray<PlannedOperation> Operations,
    SupplyVerdict Verdict);
