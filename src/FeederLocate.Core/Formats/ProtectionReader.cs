using System.Collections.Immutable;
using System.Text.Json;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Formats;

/// <summary>The protection context of an incident as read: reclosing, fuses and relay results.</summary>
internal sealed record ProtectionParts(
    Reclosing? Reclosing,
    ImmutableDictionary<SwitchId, FuseCondition> Fuses,
    ImmutableArray<RelayResult> Relays);

/// <summary>
/// Reads the optional protection fields of an incident (<c>reclosing</c>, <c>fuses</c>, <c>relays</c>)
/// and checks each device against the grid: the reclosing device must be a breaker or recloser, fuses
/// must be fuses, relays sit at breakers and reclosers.
/// </summary>
internal static class ProtectionReader
{
    public static ProtectionParts Read(ElementReader root, Grid? grid, IssueLog log) =>
        new(Reclosing(root, grid), Fuses(root, grid, log), Relays(root, grid, log));

    private static Reclosing? Reclosing(ElementReader root, Grid? grid)
    {
        if (root.Object("reclosing", required: false, nestedKind: "reclosing") is not { } r)
        {
            return null;
        }

        var device = r.RequiredString("device");
        var attempts = r.RequiredNumber("attempts", NumberRange.Any);
        var result = GridFormat.Choice(r, "result", IncidentFormat.ReclosingResults);
        r.WarnUnknownFields();
        if (attempts is { } a && (a != Math.Floor(a) || a is < 0 or > Evidence.Reclosing.MaximumAttempts))
        {
            r.Error("attempts", $"must be a whole number from 0 to {Evidence.Reclosing.MaximumAttempts}, got {ElementReader.Format(a)}");
            attempts = null;
        }

        if (device is not null)
        {
            CheckKind(r, "device", device, grid, "a breaker or recloser", SwitchKind.Breaker, SwitchKind.Recloser);
        }

        return device is null || attempts is null || result is null ? null : new Reclosing(new SwitchId(device), (int)attempts.Value, result.Value);
    }

    private static ImmutableDictionary<SwitchId, FuseCondition> Fuses(ElementReader root, Grid? grid, IssueLog log)
    {
        var fuses = ImmutableDictionary.CreateBuilder<SwitchId, FuseCondition>();
        if (root.Raw("fuses") is not { } raw || raw.ValueKind == JsonValueKind.Null)
        {
            return fuses.ToImmutable();
        }

        if (raw.ValueKind != JsonValueKind.Object)
        {
            root.Error("fuses", $"must be an object of fuse id to \"blown\" or \"intact\", got {ElementReader.Describe(raw)}");
            return fuses.ToImmutable();
        }

        foreach (var property in raw.EnumerateObject())
        {
            var field = $"fuses.{property.Name}";
            var id = new SwitchId(property.Name);
            if (grid is not null && !grid.HasSwitch(id))
            {
                log.Error("incident", "file", field, $"refers to unknown switch \"{property.Name}\"");
                continue;
            }

            if (grid is not null && grid.Switch(id).Kind != SwitchKind.Fuse)
            {
                log.Error("incident", "file", field, $"must name a fuse; {property.Name} is a {GridFormat.Name(grid.Switch(id).Kind)}");
                continue;
            }

            if (property.Value.ValueKind == JsonValueKind.String
                && IncidentFormat.FuseConditions.TryGetValue(property.Value.GetString()!, out var condition))
            {
                fuses[id] = condition;
            }
            else
            {
                log.Error("incident", "file", field, $"must be \"blown\" or \"intact\", got {ElementReader.Describe(property.Value)}");
            }
        }

        return fuses.ToImmutable();
    }

    private static ImmutableArray<RelayResult> Relays(ElementReader root, Grid? grid, IssueLog log)
    {
        var relays = ImmutableArray.CreateBuilder<RelayResult>();
        if (root.Array("relays", required: false) is not { } array)
        {
            return relays.ToImmutable();
        }

        var seen = new HashSet<string>(StringComparer.Ordinal);
        var index = 0;
        foreach (var item in array)
        {
            if (ElementReader.ForItem(item, "relay", index++, log) is not { } first)
            {
                continue;
            }

            var device = first.RequiredString("device");
            var r = device is null ? first : new ElementReader(item, "relay", device, log);
            _ = r.RequiredString("device");
            var direction = GridFormat.Choice(r, "earthFaultDirection", IncidentFormat.EarthFaultDirections, required: false);
            var reactance = r.OptionalNumber("faultReactanceOhm", NumberRange.AtLeast(0));
            r.WarnUnknownFields();
            if (device is null)
            {
                continue;
            }

            if (!r.Has("earthFaultDirection") && !r.Has("faultReactanceOhm"))
            {
                r.Error("earthFaultDirection", "or faultReactanceOhm is required: a relay entry reports at least one of them");
            }

            if (!seen.Add(device))
            {
                r.Error("device", "is listed more than once; give one relay entry per device");
                continue;
            }

            if (CheckKind(r, "device", device, grid, "a breaker or recloser", SwitchKind.Breaker, SwitchKind.Recloser))
            {
                relays.Add(new RelayResult(new SwitchId(device), direction, reactance));
            }
        }

        return relays.ToImmutable();
    }

    /// <summary>Reports an unknown device or one of the wrong kind; true when the reference is good (or no grid is given).</summary>
    private static bool CheckKind(ElementReader r, string field, string device, Grid? grid, string wanted, params SwitchKind[] kinds)
    {
        if (grid is null)
        {
            return true;
        }

        var id = new SwitchId(device);
        if (!grid.HasSwitch(id))
        {
            r.Error(field, $"refers to unknown switch \"{device}\"");
            return false;
        }

        if (!kinds.Contains(grid.Switch(id).Kind))
        {
            r.Error(field, $"must be {wanted}; {device} is a {GridFormat.Name(grid.Switch(id).Kind)}");
            return false;
        }

        return true;
    }
}
