namespace FeederLocate.Core.Switching;

/// <summary>The kind of current a closed device carries when it is asked to open.</summary>
internal enum ThroughCurrent
{
    /// <summary>Load current, or none.</summary>
    Load,

    /// <summary>The small capacitive or residual current of a standing earth fault on an isolated or resonant network.</summary>
    StandingEarthFault,

    /// <summary>A short circuit or an earth fault that trips (solid and impedance grounding).</summary>
    ShortCircuit,
}
