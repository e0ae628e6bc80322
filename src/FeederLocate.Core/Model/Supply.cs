namespace FeederLocate.Core.Model;

/// <summary>A complex impedance in ohms, as typed: resistance and reactance.</summary>
public readonly record struct ImpedanceOhm(double ResistanceOhm, double ReactanceOhm);

/// <summary>How the short-circuit strength of the supply at the MV busbar is given.</summary>
public abstract record SourceSupply;

/// <summary>Three-phase initial short-circuit power S"k at the MV busbar and R/X of the source.</summary>
public sealed record BusbarShortCircuit(double ShortCircuitMva, double ROverX) : SourceSupply;

/// <summary>Upstream network feeding the transformer's HV side (IEC 60909-0 network feeder).</summary>
public sealed record UpstreamNetwork(double NominalVoltageKv, double ShortCircuitMva, double ROverX);

/// <summary>Two-winding transformer data on its rating plate.</summary>
/// <param name="UkrPercent">Rated short-circuit voltage in percent.</param>
/// <param name="PkrKw">Rated load losses (copper losses) in kW.</param>
public sealed record TransformerData(double RatedMva, double HvKv, double MvKv, double UkrPercent, double PkrKw);

/// <summary>Supply given as upstream network plus transformer; IEC 60909-0 corrects the transformer by KT.</summary>
public sealed record UpstreamViaTransformer(UpstreamNetwork Upstream, TransformerData Transformer) : SourceSupply;
