using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Whether the ranking is split: the top section holds less than <see cref="SwitchingOptions.SplitTopShare"/>
/// and the fewest top sections holding <see cref="SwitchingOptions.SplitMassShare"/> are several.
/// </summary>
internal static class SplitRanking
{
    /// <summary>The suspects of a split ranking of a tripping fault, most likely first; empty when it is not split.</summary>
    public static List<Suspect> Suspects(PlanningContext ctx)
    {
        var ranking = ctx.Ranking;
        if (ranking is null || ranking.Sections.IsDefaultOrEmpty || ctx.StandingEarthFault
            || ranking.Sections[0].Probability >= ctx.Options.SplitTopShare)
        {
            return [];
        }

        var suspects = new List<Suspect>();
        var mass = 0.0;
        foreach (var s in ranking.Sections)
        {
            if (mass >= ctx.Options.SplitMassShare || suspects.Count == ctx.Options.MaxTrialSuspects)
            {
                break;
            }

            if (ctx.Zones.TryZoneOf(s.Id, out var zone))
            {
                suspects.Add(new Suspect(zone, s.Id, s.Probability));
            }

            mass += s.Probability;
        }

        return suspects.Count >= 2 ? suspects : [];
    }

    /// <summary>The zones of the fewest top sections holding <see cref="SwitchingOptions.SplitMassShare"/> of the probability: where the fault may still be.</summary>
    public static HashSet<int> StillSuspect(PlanningContext ctx)
    {
        var zones = new HashSet<int>();
        var mass = 0.0;
        foreach (var s in ctx.Ranking?.Sections ?? [])
        {
            if (mass >= ctx.Options.SplitMassShare || s.Probability <= 0)
            {
                break;
            }

            if (ctx.Zones.TryZoneOf(s.Id, out var zone))
            {
                zones.Add(zone);
            }

            mass += s.Probability;
        }

        return zones;
    }

    public static bool Contains(IEnumerable<Suspect> suspects, SectionId id) => suspects.Any(s => s.Section == id);
}
