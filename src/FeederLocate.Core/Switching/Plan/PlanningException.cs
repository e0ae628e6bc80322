namespace FeederLocate.Core.Switching;

/// <summary>Thrown where no switching plan can be made (unknown section, start state not radial).</summary>
public sealed class PlanningException(string message) : Exception(message);
