using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>The reason given for the close that restores a group of zones.</summary>
internal static class RestorationWords
{
    public static string Close(PlanningContext ctx, Candidate c, IEnumerable<int> zones)
    {
        var grid = ctx.Grid;
        var what = What(ctx, zones);
        var check = $"load flow with cold-load factor {Words.Number(ctx.Options.ColdLoadFactor ?? 1.0)}: lowest {Words.Pu(c.Verdict.MinimumVoltagePu)}, highest loading {Words.Percent(c.Verdict.MaximumLoadingPercent)}";
        var source = grid.Switches[c.Source];
        if (!c.NormalFeed)
        {
            return $"close tie {source.Id} from substation {grid.Substations[c.Donor].Id}: restores {what}; {check}";
        }

        return ctx.Incident.TrippedDevice == source.Id
            ? $"reclose the feeder head {source.Id}: restores {what} on their normal supply; {check}"
            : $"close {source.Id}: restores {what} on their normal supply; {check}";
    }

    /// <summary>"N customers (sections …)" of a group of zones.</summary>
    public static string What(PlanningContext ctx, IEnumerable<int> zones)
    {
        var list = zones.ToList();
        var sections = list.Select(z => ctx.Zones.All[z].Section).OfType<SectionId>().ToList();
        var customers = list.Sum(z => ctx.Zones.All[z].Customers);
        return $"{customers} customers{(sections.Count > 0 ? $" (sections {Words.List(sections)})" : string.Empty)}";
    }
}
