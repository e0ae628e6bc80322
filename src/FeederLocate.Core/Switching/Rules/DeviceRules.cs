using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// What each kind of switching device may do (the domain notes' device rules): short-circuit current is
/// broken only by breakers and reclosers; load-break switches break load and the small current of a
/// standing earth fault on isolated and resonant networks (their earth-fault breaking duty, IEC 62271-103);
/// disconnectors and fuses operate only with both nodes dead; no close joins two live parts or energises
/// the suspect section. Each check returns null when allowed, else the reason in words.
/// </summary>
internal static class DeviceRules
{
    /// <summary>True when a device of this kind may open while live, carrying <paramref name="current"/>.</summary>
    public static bool CanOpenLive(SwitchKind kind, ThroughCurrent current) => kind switch
    {
        SwitchKind.Breaker or SwitchKind.Recloser => true,
        SwitchKind.LoadBreakSwitch => current != ThroughCurrent.ShortCircuit,
        _ => false,
    };

    /// <summary>True when a device of this kind may close with one node live (onto a healthy dead part).</summary>
    public static bool CanCloseLive(SwitchKind kind) => kind is SwitchKind.Breaker or SwitchKind.Recloser or SwitchKind.LoadBreakSwitch;

    /// <summary>True when a device of this kind may close onto a part that may hold the fault (a trial closure).</summary>
    public static bool CanMakeOntoFault(SwitchKind kind) => kind is SwitchKind.Breaker or SwitchKind.Recloser;

    public static string? Open(SwitchingDevice device, bool closed, bool fromLive, bool toLive, ThroughCurrent current)
    {
        if (!closed)
        {
            return $"{device.Id} is already open";
        }

        var live = fromLive || toLive;
        if (!live)
        {
            return null;
        }

        return device.Kind switch
        {
            SwitchKind.Disconnector => $"disconnector {device.Id} may operate only with both nodes dead",
            SwitchKind.Fuse => $"fuse {device.Id} is never operated with either node live",
            SwitchKind.LoadBreakSwitch when current == ThroughCurrent.ShortCircuit =>
                $"load-break switch {device.Id} cannot break the fault current of the suspect section",
            _ => null,
        };
    }

    public static string? Close(SwitchingDevice device, bool closed, bool fromLive, bool toLive, bool energisesSuspect)
    {
        if (closed)
        {
            return $"{device.Id} is already closed";
        }

        if (fromLive && toLive)
        {
            return $"closing {device.Id} would join two live parts (a loop or two substations in parallel)";
        }

        if (energisesSuspect)
        {
            return $"closing {device.Id} would energise the suspect section";
        }

        if ((fromLive || toLive) && !CanCloseLive(device.Kind))
        {
            return device.Kind == SwitchKind.Fuse
                ? $"fuse {device.Id} is never operated with either node live"
                : $"disconnector {device.Id} may operate only with both nodes dead";
        }

        return null;
    }
}
