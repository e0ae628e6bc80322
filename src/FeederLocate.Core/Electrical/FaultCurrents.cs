using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Electrical;

/// <summary>
/// Entry point of the electrical engine: fault currents, voltages and indicator responses with the
/// reference model (shared DOMAIN notes; IEC 60909-0 for the source and short-circuit connections).
/// </summary>
public static class FaultCurrents
{
    /// <summary>Computes one fault in the given energised network.</summary>
    public static FaultResult At(EnergisedNetwork network, FaultCase fault) =>
        new FaultResponseModel(network, fault?.VoltageFactor ?? throw new ArgumentNullException(nameof(fault))).Compute(fault);

    /// <summary>Computes one fault in the grid's normal switching state.</summary>
    public static FaultResult At(Grid grid, FaultCase fault) =>
        At(new NetworkGraph(grid).Energise(SwitchStates.Normal(grid)), fault);

    /// <summary>Compiles the model for many faults in one network (ranking, evaluation, benchmarks).</summary>
    public static FaultResponseModel Model(EnergisedNetwork network, double voltageFactor = SourceImpedance.VoltageFactorMaxMediumVoltage) =>
        new(network, voltageFactor);
}
