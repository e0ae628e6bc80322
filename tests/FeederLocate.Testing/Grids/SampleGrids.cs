using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.Testing;

/// <summary>
/// The demo grids under sample-grid/ (one per grounding scheme) and the small TinyFen reference grids,
/// found in the repository and read through the real reader.
/// </summary>
public static class SampleGrids
{
    public static readonly string[] Schemes = ["impedance", "isolated", "resonant", "solid"];

    public static string Path(string scheme) => RepositoryFiles.Path("sample-grid", FileName(scheme));

    public static string FileName(string scheme) => $"marrowdell-{scheme}.grid.json";

    public static Grid Grid(string scheme) => GridReader.Parse(File.ReadAllText(Path(scheme))).ValueOrThrow();

    public static string IncidentPath(string name) => RepositoryFiles.Path("sample-grid", "incidents", $"{name}.incident.json");

    public static string TinyFenPath(string scheme) =>
        RepositoryFiles.Path("tests", "FeederLocate.Core.Tests", "ReferenceCases", "TinyFen", $"tiny-{scheme}.grid.json");

    public static Grid TinyFen(string scheme) => GridReader.Parse(File.ReadAllText(TinyFenPath(scheme))).ValueOrThrow();
}
