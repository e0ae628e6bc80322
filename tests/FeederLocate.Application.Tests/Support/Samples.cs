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

    public static NetworkGraph Graph(string scheme) => new(SampleGrids.Grid(scheme));

    /// <summary>A sample incident by file name (for instance solid-lg-trip-a1.incident.json), checked against <paramref name="grid"/>.</summary>
    public static Incident Incident(string file, Grid grid) =>
        IncidentReader.Parse(File.ReadAllText(RepositoryFiles.Path("sample-grid", "incidents", file)), grid).ValueOrThrow();
}
