using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Storage.Events;

/// <summary>Where the fault was found and what it was; a later outcome of the same incident replaces it.</summary>
/// <param name="FaultType">The confirmed fault type; null when not established.</param>
/// <param name="Cause">Free text, for instance "tree contact" or "cable joint".</param>
public sealed record OutcomeLogged(
    SegmentId ConfirmedSegment,
    FaultType? FaultType = null,
    string? Cause = null,
    string? Notes = null) : IncidentEvent;
