using System.Text.Json;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.Testing;

/// <summary>The sample grids and incidents the fuzz tests mutate, each incident with the grid it names.</summary>
public static class SampleFiles
{
    private static readonly Lazy<IReadOnlyList<SampleGrid>> LazyGrids = new(() =>
        SampleGrids.Schemes.Select(s => new SampleGrid(s, SampleGrids.Path(s), File.ReadAllText(SampleGrids.Path(s)), GridReader.Parse(File.ReadAllText(SampleGrids.Path(s))).ValueOrThrow())).ToList());

    private static readonly Lazy<IReadOnlyList<SampleIncident>> LazyIncidents = new(() =>
        Directory.GetFiles(RepositoryFiles.Path("sample-grid", "incidents"), "*.incident.json")
            .Order(StringComparer.Ordinal)
            .Select(path =>
            {
                var text = File.ReadAllText(path);
                using var document = JsonDocument.Parse(text);
                var gridFile = Path.GetFileName(document.RootElement.GetProperty("grid").GetString()!);
                var grid = Grids.Single(g => Path.GetFileName(g.Path) == gridFile);
                return new SampleIncident(Path.GetFileName(path), path, text, grid);
            })
            .ToList());

    public static IReadOnlyList<SampleGrid> Grids => LazyGrids.Value;

    public static IReadOnlyList<SampleIncident> Incidents => LazyIncidents.Value;

    /// <summary>The first sample incident recorded on <paramref name="grid"/>, for ranking a mutant of that grid.</summary>
    public static SampleIncident IncidentOn(SampleGrid grid) => Incidents.First(i => i.Grid == grid);
}

public sealed record SampleGrid(string Scheme, string Path, string Text, Grid Grid);

public sealed record SampleIncident(string Name, string Path, string Text, SampleGrid Grid);
