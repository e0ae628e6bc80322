namespace FeederLocate.Storage.Incidents;

/// <summary>
/// Where an incident stands, in the order an operator works it: open (fault reported), located (the faulted
/// section found), isolated (it is cut off on every side), restored (the healthy part supplied again),
/// repaired (the fault cleared on site), closed (back to normal and finished).
/// </summary>
public enum IncidentStage
{
    Open,
    Located,
    Isolated,
    Restored,
    Repaired,
    Closed,
}

/// <summary>The stages' names as logged and shown.</summary>
public static class IncidentStages
{
    public static string Name(IncidentStage stage) => stage.ToString().ToLowerInvariant();

    public static bool TryParse(string? text, out IncidentStage stage) =>
        Enum.TryParse(text, ignoreCase: true, out stage) && Enum.IsDefined(stage) && !int.TryParse(text, out _);
}
