namespace FeederLocate.Core.Model;

/// <summary>A node of the MV network. Load is three-phase total; LoadKvar null means power factor 0.95 lagging.</summary>
public sealed record Node(
    NodeId Id,
    double LoadKw = 0,
    double? LoadKvar = null,
    int Customers = 0,
    double? X = null,
    double? Y = null);
