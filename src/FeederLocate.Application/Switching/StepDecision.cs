namespace FeederLocate.Application.Switching;

/// <summary>What came of a tick, a correction or a deviation: logged, or refused with the reason in words.</summary>
public sealed record StepDecision(string? Refusal)
{
    public static StepDecision Logged { get; } = new((string?)null);

    public bool IsLogged => Refusal is null;

    public static StepDecision Refused(string reason) => new(reason);
}
