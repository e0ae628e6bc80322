using System.Text.Json;
using FeederLocate.Core.Tests.Support;
using Json.Schema;

namespace FeederLocate.Core.Tests.Formats;

/// <summary>The JSON Schema files in sample-grid/schemas (draft 2020-12) against the project's own files.</summary>
public class SchemaTests
{
    private static readonly Lazy<JsonSchema> GridSchema = new(() => Load("grid.schema.json"));

    private static readonly Lazy<JsonSchema> IncidentSchema = new(() => Load("incident.schema.json"));

    public static TheoryData<string> GridFiles => Files("*.grid.json",
        ["sample-grid"], ["sample-grid", "scenarios"], ["tests", "FeederLocate.Core.Tests", "ReferenceCases", "TinyFen"]);

    public static TheoryData<string> IncidentFiles => Files("*.incident.json",
        ["sample-grid", "incidents"], ["tests", "FeederLocate.Core.Tests", "ReferenceCases", "TinyFen"]);

    [Theory]
    [MemberData(nameof(GridFiles))]
    public void Grid_file_validates_against_the_grid_schema(string file)
    {
        var results = Evaluate(GridSchema.Value, RepositoryFiles.Path(file.Split('/')));

        Assert.True(results.IsValid, Describe(results));
    }

    [Theory]
    [MemberData(nameof(IncidentFiles))]
    public void Incident_file_validates_against_the_incident_schema(string file)
    {
        var results = Evaluate(IncidentSchema.Value, RepositoryFiles.Path(file.Split('/')));

        Assert.True(results.IsValid, Describe(results));
    }

    [Fact]
    public void Every_sample_grid_and_incident_is_checked()
    {
        Assert.Equal(4 + 2 + 4, GridFiles.Count); // sample grids, scenario grids, TinyFen grids
        Assert.Equal(10 + 1, IncidentFiles.Count);
    }

    [Theory]
    [InlineData("negative-length")]
    [InlineData("zero-length")]
    [InlineData("negative-capacitance")]
    [InlineData("unknown-scheme")]
    [InlineData("resonant-without-detuning")]
    [InlineData("impedance-without-resistor")]
    [InlineData("solid-without-transformer-z0")]
    [InlineData("wrong-format-tag")]
    [InlineData("string-for-number")]
    [InlineData("several-errors")]
    public void Grid_schema_rejects_a_structurally_broken_grid(string name)
    {
        var results = Evaluate(GridSchema.Value, RepositoryFiles.Path("tests", "FeederLocate.Core.Tests", "Formats", "BrokenGrids", $"{name}.grid.json"));

        Assert.False(results.IsValid);
    }

    [Theory]
    [InlineData("bad-state")]
    [InlineData("bad-reported-time")]
    [InlineData("read-date-without-time")]
    [InlineData("bad-switch-position")]
    [InlineData("unknown-fault-type")]
    [InlineData("wrong-format-tag")]
    [InlineData("reclosing-attempts-out-of-range")]
    [InlineData("relay-bad-direction")]
    [InlineData("relay-negative-reactance")]
    public void Incident_schema_rejects_a_structurally_broken_incident(string name)
    {
        var results = Evaluate(IncidentSchema.Value, RepositoryFiles.Path("tests", "FeederLocate.Core.Tests", "Formats", "BrokenIncidents", $"{name}.incident.json"));

        Assert.False(results.IsValid);
    }

    [Theory]
    [InlineData("""[ { "id": "DEPOT", "node": "N1", "count": 2, "travelMinutes": { "D2": 30 } }, { "id": "WEST", "name": "West yard", "node": "N5", "count": 1 } ]""", true)]
    [InlineData("""[ { "id": "DEPOT", "node": "N1" } ]""", false)]
    [InlineData("""[ { "id": "DEPOT", "node": "N1", "count": 0 } ]""", false)]
    [InlineData("""[ { "id": "DEPOT", "node": "N1", "count": 1.5 } ]""", false)]
    [InlineData("""[ { "id": "DEPOT", "node": "N1", "count": 1, "travelMinutes": { "D2": -1 } } ]""", false)]
    [InlineData("""[ { "id": "DEPOT", "node": "N1", "count": 1, "crew": 3 } ]""", false)]
    public void Grid_schema_describes_the_crews(string crews, bool valid)
    {
        using var document = JsonDocument.Parse(Switching.CrewScheduleTests.FeederText(crews));

        var results = GridSchema.Value.Evaluate(document.RootElement, new EvaluationOptions { OutputFormat = OutputFormat.List });

        Assert.True(results.IsValid == valid, Describe(results));
    }

    private static JsonSchema Load(string name) =>
        JsonSchema.FromText(RepositoryFiles.Read("sample-grid", "schemas", name), new BuildOptions { SchemaRegistry = new SchemaRegistry() });

    private static EvaluationResults Evaluate(JsonSchema schema, string path)
    {
        using var document = JsonDocument.Parse(File.ReadAllText(path));
        return schema.Evaluate(document.RootElement, new EvaluationOptions { OutputFormat = OutputFormat.List });
    }

    private static string Describe(EvaluationResults results) =>
        string.Join("\n", (results.Details ?? []).Where(d => d.Errors is not null)
            .SelectMany(d => d.Errors!.Select(e => $"{d.InstanceLocation}: {e.Key} {e.Value}")));

    private static TheoryData<string> Files(string pattern, params string[][] folders)
    {
        var data = new TheoryData<string>();
        foreach (var folder in folders)
        {
            foreach (var file in Directory.GetFiles(RepositoryFiles.Path(folder), pattern).Order(StringComparer.Ordinal))
            {
                data.Add(string.Join('/', [.. folder, Path.GetFileName(file)]));
            }
        }

        return data;
    }
}
