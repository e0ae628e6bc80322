using System.Security.Claims;
using System.Text.Json.Nodes;
using Bunit;
using FeederLocate.Core.Comparison;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Grids;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.Components.Grids;
using FeederLocate.Web.Components.OneLine;
using FeederLocate.Web.Components.Pages.Grids;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;
using FeederLocate.Web.Tests.Support;
using Microsoft.AspNetCore.Components.Forms;
using Microsoft.Extensions.DependencyInjection;

namespace FeederLocate.Web.Tests.Components;

/// <summary>Grid versions on the pages: the empty drawing's message, the version list, the comparison, the pin and the confirmed replacement.</summary>
public sealed class GridVersionComponentTests : ComponentTest
{
    private static readonly DateTimeOffset At = new(2026, 12, 1, 7, 30, 0, TimeSpan.Zero);

    private static DiagramState NoState() => new(new HashSet<SwitchId>(), new HashSet<SegmentId>(), new Dictionary<IndicatorId, DiagramIndication>(), new Dictionary<SectionId, double>(), new HashSet<SectionId>());

    [Fact]
    public void A_grid_without_nodes_shows_a_message_instead_of_an_empty_drawing()
    {
        var empty = GridReader.Parse(
            "{ \"format\": \"feederlocate-grid/1\", \"name\": \"Empty test\", \"frequencyHz\": 50, \"lineTypes\": [], \"substations\": [], \"nodes\": [], \"segments\": [], \"switches\": [], \"indicators\": [] }").Value!;
        var loaded = LoadedGrid.Of("empty.grid.json", empty);

        var cut = Render<OneLineDiagram>(p => p.Add(c => c.Drawing, loaded.Drawing).Add(c => c.Problem, loaded.DrawingProblem).Add(c => c.State, NoState()));

        Assert.Contains("no nodes", cut.Find("[data-testid=drawing-problem]").TextContent, StringComparison.Ordinal);
        Assert.Empty(cut.FindAll("svg"));
    }

    [Fact]
    public void A_drawing_problem_is_shown_in_words()
    {
        var grid = LoadedGrids.Sample("solid");

        var cut = Render<OneLineDiagram>(p => p.Add(c => c.Drawing, grid.Drawing).Add(c => c.Problem, "The one-line view could not be drawn: a test reason").Add(c => c.State, NoState()));

        Assert.Equal("The one-line view could not be drawn: a test reason", cut.Find("[data-testid=drawing-problem]").TextContent);
    }

    [Fact]
    public void The_version_list_shows_who_loaded_each_version_when_and_why_newest_first()
    {
        var versions = new[]
        {
            new GridVersion("North", 1, new string('a', 64), At, new Actor("start-up", "system"), "grid file north.grid.json at first start", "north.grid.json"),
            new GridVersion("North", 2, new string('b', 64), At.AddDays(2), new Actor("grid-engineer", "engineer"), "recloser R7 fitted", "north-r7.json"),
        };

        var cut = Render<GridVersionList>(p => p.Add(c => c.Versions, versions));

        var rows = cut.FindAll("tr[data-version]");
        Assert.Equal(["2", "1"], rows.Select(r => r.GetAttribute("data-version")));
        Assert.Contains("2 (latest)", rows[0].TextContent, StringComparison.Ordinal);
        Assert.Contains("grid-engineer (engineer)", rows[0].TextContent, StringComparison.Ordinal);
        Assert.Contains("2026-12-03 07:30 UTC", rows[0].TextContent, StringComparison.Ordinal);
        Assert.Contains("recloser R7 fitted", rows[0].TextContent, StringComparison.Ordinal);
        Assert.Contains("start-up (system)", rows[1].TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void The_comparison_lists_each_added_removed_and_changed_element_with_its_fields()
    {
        var difference = new GridDifference([], [
            new ElementChange("segments", "S9", ElementChangeKind.Added, []),
            new ElementChange("indicators", "FI2", ElementChangeKind.Removed, []),
            new ElementChange("switches", "LB4", ElementChangeKind.Changed, [new FieldChange("remote", "false", "true"), new FieldChange("travelMinutes", "25", null)]),
        ]);

        var cut = Render<GridDifferenceTable>(p => p.Add(c => c.Difference, difference).Add(c => c.BeforeLabel, "version 1").Add(c => c.AfterLabel, "version 2"));

        Assert.Equal("1 added, 1 removed, 1 changed.", cut.Find("[data-testid=grid-diff-summary]").TextContent);
        Assert.Equal(["added", "removed", "changed", "changed"], cut.FindAll("tbody tr").Select(r => r.GetAttribute("data-change")));
        Assert.Contains("segment S9", cut.FindAll("tbody tr")[0].TextContent, StringComparison.Ordinal);
        Assert.Equal(["switch LB4", "changed", "travelMinutes", "25", "–"], cut.FindAll("tbody tr")[3].QuerySelectorAll("td").Select(td => td.TextContent));
        Assert.Contains("version 2", cut.Find("thead").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void An_engineer_moves_a_pinned_incident_to_the_newer_version_only_with_a_reason()
    {
        (int Version, string Reason)? moved = null;
        var cut = Render<GridVersionPin>(p => p.Add(c => c.Pinned, 1).Add(c => c.Latest, 3).Add(c => c.MayMove, true)
            .Add(c => c.OnMove, ((int Version, string Reason) m) => moved = m));

        Assert.Contains("version 3 is stored", cut.Find("[data-testid=grid-newer]").TextContent, StringComparison.Ordinal);
        Assert.True(cut.Find("[data-testid=grid-move]").HasAttribute("disabled"));
        cut.Find("[data-testid=grid-move-reason]").Input("recloser R7 now in the model");
        cut.Find("[data-testid=grid-move]").Click();

        Assert.Equal((3, "recloser R7 now in the model"), moved);
    }

    [Fact]
    public void Without_the_engineer_role_or_a_newer_version_there_is_no_move()
    {
        var operatorView = Render<GridVersionPin>(p => p.Add(c => c.Pinned, 1).Add(c => c.Latest, 2).Add(c => c.MayMove, false));
        var current = Render<GridVersionPin>(p => p.Add(c => c.Pinned, 2).Add(c => c.Latest, 2).Add(c => c.MayMove, true)
            .Add(c => c.Moves, [new GridMove(1, 2, "new survey", new Actor("grid-engineer", "engineer"), At)]));

        Assert.Empty(operatorView.FindAll("[data-testid=grid-move]"));
        Assert.NotEmpty(operatorView.FindAll("[data-testid=grid-newer]"));
        Assert.Empty(current.FindAll("[data-testid=grid-move]"));
        Assert.Empty(current.FindAll("[data-testid=grid-newer]"));
        Assert.Equal("Grid version 2", current.Find("[data-testid=grid-pinned-version]").TextContent);
        Assert.Contains("moved from version 1 to 2 by grid-engineer", current.Find("[data-testid=grid-moves]").TextContent, StringComparison.Ordinal);
    }
}

/// <summary>The Grids page over a fresh database, signed in as an engineer (services registered before bUnit's own setup reads any).</summary>
public sealed class GridsPageTests : BunitContext
{
    private readonly TempDatabase _database = new();
    private readonly GridCatalog _grids;

    public GridsPageTests()
    {
        _grids = LoadedGrids.Catalog(Path.Combine(Path.GetTempPath(), "feederlocate-no-grids-" + Guid.NewGuid().ToString("N")), "none", _database.Path);
        Services.AddSingleton(_grids);
        var access = AddAuthorization();
        access.SetAuthorized("grid-engineer");
        access.SetRoles("engineer");
        access.SetClaims(new Claim(AccountClaims.EveryGrid, "true"));
        SetRendererInfo(new Microsoft.AspNetCore.Components.RendererInfo("Server", isInteractive: true));
        JSInterop.Mode = JSRuntimeMode.Loose;
    }

    protected override void Dispose(bool disposing)
    {
        base.Dispose(disposing);
        if (disposing)
        {
            _grids.Versions.Dispose();
            _database.Dispose();
        }
    }

    [Fact]
    public void Uploading_a_grid_of_a_stored_name_asks_for_confirmation_shows_the_differences_and_stores_the_next_version_with_the_reason()
    {
        var grids = _grids;
        var original = GridWriter.Write(TestGrids.Brackenfold());
        var edited = JsonNode.Parse(original)!.AsObject();
        edited["segments"]![2]!["lengthKm"] = 5.6;

        var cut = Render<GridsPage>();
        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromText(original, "brackenfold.grid.json"));
        cut.WaitForAssertion(() => Assert.Contains("as version 1", cut.Find("[data-testid=grid-loaded]").TextContent, StringComparison.Ordinal));
        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromText(edited.ToJsonString(), "brackenfold.grid.json"));

        var dialog = cut.WaitForElement("[data-testid=grid-replace]");
        Assert.Contains("confirm the replacement", dialog.TextContent, StringComparison.Ordinal);
        Assert.Equal(["segment S3", "changed", "lengthKm", "5", "5.6"], cut.FindAll("[data-testid=grid-replace] tbody tr td").Select(td => td.TextContent));
        Assert.Single(grids.Versions.Versions(TestGrids.BrackenfoldName));
        Assert.True(cut.Find("[data-testid=grid-replace-confirm]").HasAttribute("disabled"));

        cut.Find("[data-testid=grid-replace-reason]").Input("S3 re-surveyed");
        cut.Find("[data-testid=grid-replace-confirm]").Click();

        cut.WaitForAssertion(() => Assert.Contains("as version 2", cut.Find("[data-testid=grid-loaded]").TextContent, StringComparison.Ordinal));
        var stored = grids.Versions.Versions(TestGrids.BrackenfoldName);
        Assert.Equal([1, 2], stored.Select(v => v.Version));
        Assert.Equal(("S3 re-surveyed", "grid-engineer"), (stored[1].Reason, stored[1].LoadedBy.Name));
        Assert.Equal(["2", "1"], cut.FindAll("[data-testid=grid-versions] tr[data-version]").Select(r => r.GetAttribute("data-version")));
    }
}
