using System.Text.Json.Nodes;
using FeederLocate.Application.Grids;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Grids;

namespace FeederLocate.Cli.Tests.Commands;

public sealed class GridCommandsTests : IDisposable
{
    private readonly DirectoryInfo _folder = Directory.CreateTempSubdirectory("feederlocate-grid-diff-");

    public void Dispose() => _folder.Delete(recursive: true);

    private string Write(string name, string text)
    {
        var path = Path.Combine(_folder.FullName, name);
        File.WriteAllText(path, text);
        return path;
    }

    private static string Edited(Action<JsonObject> change)
    {
        var grid = JsonNode.Parse(File.ReadAllText(SampleGrids.Path("resonant")))!.AsObject();
        change(grid);
        return grid.ToJsonString();
    }

    [Fact]
    public void Grid_diff_names_what_was_added_removed_and_changed_between_two_files()
    {
        var before = SampleGrids.Path("resonant");
        var firstSegment = SampleGrids.Grid("resonant").Segments[0];
        var firstIndicator = SampleGrids.Grid("resonant").Indicators[0];
        var after = Write("after.grid.json", Edited(g =>
        {
            g["segments"]![0]!["lengthKm"] = firstSegment.LengthKm + 0.25;
            g["indicators"]!.AsArray().RemoveAt(0);
        }));

        var run = CliRun.Of("grid-diff", before, after, "--json");

        Assert.Equal(0, run.ExitCode);
        var document = run.Json();
        Assert.Equal((0, 1, 1), (document.GetProperty("added").GetInt32(), document.GetProperty("removed").GetInt32(), document.GetProperty("changed").GetInt32()));
        var elements = document.GetProperty("elements").EnumerateArray().ToList();
        Assert.Contains(elements, e => e.GetProperty("id").GetString() == firstIndicator.Id.Value && e.GetProperty("change").GetString() == "removed");
        var changed = Assert.Single(elements, e => e.GetProperty("change").GetString() == "changed");
        Assert.Equal(firstSegment.Id.Value, changed.GetProperty("id").GetString());
        Assert.Equal("lengthKm", changed.GetProperty("fields")[0].GetProperty("field").GetString());
    }

    [Fact]
    public void Grid_diff_of_a_file_with_itself_has_no_differences_and_a_broken_file_is_bad_input()
    {
        var same = CliRun.Of("grid-diff", SampleGrids.Path("solid"), SampleGrids.Path("solid"));
        var broken = CliRun.Of("grid-diff", SampleGrids.Path("solid"), Write("broken.grid.json", "{ \"format\": \"feederlocate-grid/1\" }"));

        Assert.Equal(0, same.ExitCode);
        Assert.Contains("no differences", same.Out, StringComparison.Ordinal);
        Assert.Equal(2, broken.ExitCode);
        Assert.Contains("error", broken.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void Grid_versions_lists_the_stored_versions_with_who_and_why()
    {
        var db = Path.Combine(_folder.FullName, "log.db");
        using (var grids = new GridVersions(GridVersionStore.Open(db)))
        {
            var text = File.ReadAllText(SampleGrids.Path("solid"));
            grids.LoadAtStartUp("solid.grid.json", text);
            grids.Load(Edited(g => g["name"] = SampleGrids.Grid("solid").Name), "edit.json", new Actor("grid-engineer", "engineer"), replace: true, reason: "resonant data under the solid name");
        }

        var run = CliRun.Of("grid-versions", "--db", db, "--json");

        Assert.Equal(0, run.ExitCode);
        var versions = run.Json().EnumerateArray().ToList();
        Assert.Equal([1, 2], versions.Select(v => v.GetProperty("version").GetInt32()));
        Assert.Equal("start-up", versions[0].GetProperty("loadedBy").GetString());
        Assert.Equal("resonant data under the solid name", versions[1].GetProperty("reason").GetString());
    }

    [Fact]
    public void Check_warns_about_a_grid_without_nodes()
    {
        var empty = Write("empty.grid.json",
            "{ \"format\": \"feederlocate-grid/1\", \"name\": \"Empty test\", \"frequencyHz\": 50, \"lineTypes\": [], \"substations\": [], \"nodes\": [], \"segments\": [], \"switches\": [], \"indicators\": [] }");

        var run = CliRun.Of("check", empty, "--json");

        var warning = Assert.Single(run.Json().GetProperty("warnings").EnumerateArray());
        Assert.Equal("nodes", warning.GetProperty("field").GetString());
        Assert.Contains("nothing to draw", warning.GetProperty("message").GetString(), StringComparison.Ordinal);
    }
}
