using FeederLocate.Core.Model;

namespace FeederLocate.Web.Services;

/// <summary>A grid's devices and segments as the incident page's forms list them, made once per grid version.</summary>
public sealed record GridDeviceLists(
    IReadOnlyList<SwitchId> Breakers,
    IReadOnlyList<SwitchId> Protective,
    IReadOnlyList<SwitchId> Reclosers,
    IReadOnlyList<SwitchId> Fuses,
    IReadOnlyList<SwitchId> Switches,
    IReadOnlyList<SegmentId> Segments)
{
    public static GridDeviceLists Of(Grid grid)
    {
        ArgumentNullException.ThrowIfNull(grid);
        return new(
            [.. grid.Switches.Where(s => s.Kind == SwitchKind.Breaker).Select(s => s.Id)],
            [.. grid.Switches.Where(s => s.Kind is SwitchKind.Breaker or SwitchKind.Recloser or SwitchKind.Fuse).Select(s => s.Id)],
            [.. grid.Switches.Where(s => s.Kind is SwitchKind.Breaker or SwitchKind.Recloser).Select(s => s.Id)],
            [.. grid.Switches.Where(s => s.Kind == SwitchKind.Fuse).Select(s => s.Id)],
            [.. grid.Switches.Select(s => s.Id)],
            [.. grid.Segments.Select(s => s.Id)]);
    }
}
