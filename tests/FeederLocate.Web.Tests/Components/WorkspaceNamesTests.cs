using System.Security.Claims;
using AngleSharp.Dom;
using Bunit;
using FeederLocate.Application.Analysis;
using FeederLocate.Application.History;
using FeederLocate.Core.Formats;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Components.Pages.Workspace;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;
using FeederLocate.Web.Tests.Support;
using Microsoft.Extensions.DependencyInjection;

namespace FeederLocate.Web.Tests.Components;

/// <summary>
/// The incident page names segments and sections as operators do: no segment or section id of the grid is
/// shown as text (ids stay in tooltips, data attributes and JSON). Each sample incident is opened with the real
/// services, an outcome logged and the return to normal asked for, so that every panel is drawn.
/// </summary>
public sealed class WorkspaceNamesTests : BunitContext
{
    private readonly TempDatabase _database = new();
    private readonly IncidentBoard _board;
    private readonly GridCatalog _grids;
    private static readonly Actor Ana = new("ana", "operator");

    public WorkspaceNamesTests()
    {
        _grids = LoadedGrids.Samples(_database.Path);
        _board = new IncidentBoard(IncidentStore.Open(_database.Path));
        WorkspaceServices.Add(Services, _grids, _board, new IncidentAnalysis(new GridLearning(_board), new CoreFaultRanker()));
        var access = AddAuthorization();
        access.SetAuthorized("ana");
        access.SetRoles("operator");
        access.SetClaims(new Claim(AccountClaims.EveryGrid, "true"));
        SetRendererInfo(new Microsoft.AspNetCore.Components.RendererInfo("Server", isInteractive: true));
        JSInterop.Mode = JSRuntimeMode.Loose;
    }

    public static TheoryData<string> SampleIncidents() =>
    [
        .. Directory.GetFiles(RepositoryFiles.Path("sample-grid", "incidents"), "*.incident.json")
            .Select(f => Path.GetFileName(f)[..^".incident.json".Length])
            .Order(StringComparer.Ordinal),
    ];

    [Theory]
    [MemberData(nameof(SampleIncidents))]
    public void No_segment_or_section_id_is_shown_as_text_on_the_incident_page(string name)
    {
        var scheme = SampleGrids.Schemes.First(s => name.StartsWith(s, StringComparison.Ordinal));
        var loaded = _grids.All.Single(g => g.Key == SampleGrids.FileName(scheme));
        var incident = IncidentReader.Parse(File.ReadAllText(SampleGrids.IncidentPath(name)), loaded.Grid).ValueOrThrow();
        var id = _board.Open(loaded, incident, Ana);
        var confirmed = loaded.Grid.Segments[loaded.Grid.Segments.Length / 2].Id;
        _board.Append(id, new OutcomeLogged(confirmed, incident.FaultType, "tree contact", null), Ana);

        var cut = Render<IncidentWorkspace>(p => p.Add(c => c.Id, id.Value));
        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-testid=working]")), TimeSpan.FromMinutes(2));
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-testid=ranked-list] ol.sections li, [data-testid=ranked-list] .warning")), TimeSpan.FromMinutes(2));
        if (cut.FindAll("[data-testid=show-return]").Count > 0)
        {
            cut.Find("[data-testid=show-return]").Click();
            cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-testid=show-return]")), TimeSpan.FromMinutes(2));
        }

        var ids = loaded.Grid.Segments.Select(s => s.Id.Value)
            .Concat(loaded.Graph.Sections.All.Select(s => s.Id.Value))
            .ToHashSet(StringComparer.Ordinal);
        var shown = new List<string>();
        var inTooltips = 0;
        foreach (var node in cut.Nodes.SelectMany(n => n.GetDescendantsAndSelf()))
        {
            if (node is IText text && !InTooltip(text))
            {
                shown.AddRange(Words(text.Data).Where(ids.Contains).Select(w => $"\"{w}\" in \"{text.Data.Trim()}\""));
            }
            else if (node is IElement element && element.GetAttribute("title") is { } title)
            {
                inTooltips += Words(title).Count(ids.Contains);
            }
        }

        Assert.Empty(shown);

        // The check sees the ids where they belong: in the tooltips (the confirmed segment's, the suspects').
        Assert.True(inTooltips > 0, "no segment or section id in any tooltip: the page was not drawn with the grid's elements");
    }

    /// <summary>Inside an SVG &lt;title&gt;, which the browser shows as the element's tooltip, never as text.</summary>
    private static bool InTooltip(INode node)
    {
        for (var parent = node.ParentElement; parent is not null; parent = parent.ParentElement)
        {
            if (string.Equals(parent.LocalName, "title", StringComparison.Ordinal))
            {
                return true;
            }
        }

        return false;
    }

    /// <summary>The words of a text as ids are written: letters, digits and _ . - inside, without a closing full stop.</summary>
    private static IEnumerable<string> Words(string text) =>
        text.Split((char[])[' ', '\t', '\n', '\r', ',', ';', ':', '(', ')', '[', ']', '+', '→', '/', '"', '\'', '·', '='], StringSplitOptions.RemoveEmptyEntries)
            .Select(w => w.TrimEnd('.', '-'));

    protected override void Dispose(bool disposing)
    {
        base.Dispose(disposing);
        if (disposing)
        {
            _board.Dispose();
            _database.Dispose();
        }
    }
}
