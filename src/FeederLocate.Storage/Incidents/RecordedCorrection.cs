using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>A tick withdrawn: the step it withdrew (null when that step was no longer ticked, for instance when two operators corrected it at once), why, who and when.</summary>
public sealed record RecordedCorrection(CompletedPlanStep? Withdrawn, string Reason, Actor Actor, DateTimeOffset CorrectedAt);
