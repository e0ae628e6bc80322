namespace FeederLocate.Web.Components.Workspace;

/// <summary>An operator's request to withdraw the tick of step <paramref name="Order"/>, with the reason.</summary>
public sealed record StepCorrectionRequest(int Order, string Reason);
