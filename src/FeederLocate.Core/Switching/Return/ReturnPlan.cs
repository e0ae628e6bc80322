using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The return to normal after the repair: from the state a switching plan left, the crew's clearance
/// (permit cancelled, earths off, locks and remote blocks removed), then the opens and closes that bring
/// every device back to its normal position, each safe by the device rules and none paralleling two
/// substations or closing a loop (break before make).
/// </summary>
/// <param name="Steps">Carried out in ascending order; <see cref="SwitchingStep.At"/> counts from the moment the repair is reported complete.</param>
/// <param name="MostCustomersInterrupted">The most customers without supply at any moment of the return (those a break-before-make transfer drops briefly included).</param>
/// <param name="CustomerMinutesInterrupted">IEEE 1366 CMI over the return, from its start to its last switching step.</param>
public sealed record ReturnPlan(
    ImmutableArray<SwitchingStep> Steps,
    int MostCustomersInterrupted,
    double CustomerMinutesInterrupted,
    ImmutableArray<string> Cautions,
    ImmutableArray<string> Approximations);
