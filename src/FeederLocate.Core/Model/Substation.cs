namespace FeederLocate.Core.Model;

/// <summary>A substation's MV busbar: the source of every feeder connected to it.</summary>
/// <param name="TransformerZ0Ohm">Zero-sequence impedance of the transformer seen from the MV side; needed for solid and impedance grounding.</param>
/// <param name="TransformerRatedMva">Optional bound on the load the substation can take on during restoration.</param>
public sealed record Substation(
    SubstationId Id,
    NodeId BusNode,
    double NominalVoltageKv,
    SourceSupply Supply,
    ImpedanceOhm? TransformerZ0Ohm,
    double? TransformerRatedMva,
    Grounding Grounding);
