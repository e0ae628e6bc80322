using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Events;

namespace FeederLocate.Application.Tests.Support;

/// <summary>The demo grids and incidents of sample-grid/ (invented), read as the programs read them.</summary>
public static class Samples
{
    public static Actor Operator { get; } = new("ana", "operator");

    public static string Root { get; } = FindRoot(AppContext.BaseDirectory);

    public static NetworkGraph Graph(string scheme) =>
        new(GridReader.Parse(File.ReadAllText(Path.Combine(Root, "sample-grid", $"marrowdell-{scheme}.grid.json"))).ValueOrThrow());

    public static Incident Incident(string file, Grid grid) =>
        IncidentReader.Parse(File.ReadAllText(Path.Combine(Root, "sample-grid", "incidents", file)), grid).ValueOrThrow();

    private static string FindRoot(string start)
    {
        for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "FeederLocate.sln")))
            {
                return dir.FullName;
            }
        }

        throw new InvalidOperationException($"no FeederLocate.sln above {start}");
    }
}
