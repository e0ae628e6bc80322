using System.Security.Claims;
using Bunit;
using FeederLocate.Application.Analysis;
using FeederLocate.Application.History;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Components.Pages.Workspace;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;
using FeederLocate.Web.Tests.Support;
using Microsoft.Extensions.DependencyInjection;

namespace FeederLocate.Web.Tests.Components;

/// <summary>The incident page with the real services over a fresh SQLite file (registered before bUnit's own setup reads any).</summary>
public sealed class WorkspaceAnalysisTests : BunitContext
{
    private readonly TempDatabase _database = new();
    private readonly HeldRanker _ranker = new();
    private readonly IncidentBoard _board;
    private readonly GridCatalog _grids;

    public WorkspaceAnalysisTests()
    {
        _grids = LoadedGrids.Samples(_database.Path);
        _board = new IncidentBoard(IncidentStore.Open(_database.Path));
        WorkspaceServices.Add(Services, _grids, _board, new IncidentAnalysis(new GridLearning(_board), _ranker));
        var access = AddAuthorization();
        access.SetAuthorized("ana");
        access.SetRoles("operator");
        access.SetClaims(new Claim(AccountClaims.EveryGrid, "true"));
        SetRendererInfo(new Microsoft.AspNetCore.Components.RendererInfo("Server", isInteractive: true));
        JSInterop.Mode = JSRuntimeMode.Loose;
    }

    [Fact]
    public void The_incident_page_says_it_is_computing_until_the_ranking_is_ready_then_shows_it()
    {
        var id = _board.Open(_grids.Default!, new SwitchId("CB-A1"), FaultType.LG, new DateTimeOffset(2026, 11, 30, 6, 12, 0, TimeSpan.Zero), new Actor("ana", "operator"));

        _ranker.Hold();
        var cut = Render<IncidentWorkspace>(p => p.Add(c => c.Id, id.Value));
        // Checked while the ranking is held: once released, the page may already say it is planning the order.
        cut.Find("[data-testid=working]").MarkupMatches("""<span class="busy" role="status" data-testid="working">computing the suspects and the switching order…</span>""");
        _ranker.Release();

        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-testid=working]")), TimeSpan.FromMinutes(1));
        Assert.NotEmpty(cut.FindAll("li[data-section]"));
    }

    [Fact]
    public void The_suspects_are_shown_before_the_switching_order_is_planned_and_the_entry_forms_follow_them()
    {
        var id = _board.Open(_grids.Default!, new SwitchId("CB-A1"), FaultType.LG, new DateTimeOffset(2026, 11, 30, 6, 12, 0, TimeSpan.Zero), new Actor("ana", "operator"));
        _ranker.Hold();
        var cut = Render<IncidentWorkspace>(p => p.Add(c => c.Id, id.Value));
        var shown = new System.Collections.Concurrent.ConcurrentQueue<string>();
        cut.OnMarkupUpdated += (_, _) => shown.Enqueue(cut.Markup);
        Assert.NotEmpty(cut.FindAll("[data-testid=forms-busy]"));

        _ranker.Release();

        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-testid=next-step]")), TimeSpan.FromMinutes(1));
        var markups = shown.ToList();
        // First the ranked suspects with the order still being planned and the entry forms not yet drawn...
        var suspects = markups.FindIndex(m => m.Contains("data-section=", StringComparison.Ordinal));
        Assert.True(suspects >= 0);
        Assert.Contains("data-testid=\"plan-busy\"", markups[suspects], StringComparison.Ordinal);
        Assert.Contains("planning the switching order…", markups[suspects], StringComparison.Ordinal);
        Assert.Contains("data-testid=\"forms-busy\"", markups[suspects], StringComparison.Ordinal);
        // ...then the entry forms, then the switching order.
        var forms = markups.FindIndex(m => m.Contains("data-testid=\"indicator-entry\"", StringComparison.Ordinal));
        var order = markups.FindIndex(m => m.Contains("data-testid=\"next-step\"", StringComparison.Ordinal));
        Assert.InRange(forms, suspects + 1, order - 1);
        Assert.Empty(cut.FindAll("[data-testid=working]"));
    }

    [Fact]
    public async Task A_switch_click_records_nothing_until_the_operator_confirms_the_device_and_position()
    {
        var id = _board.Open(_grids.Default!, new SwitchId("CB-A1"), FaultType.LG, new DateTimeOffset(2026, 11, 30, 6, 12, 0, TimeSpan.Zero), new Actor("ana", "operator"));
        var cut = Render<IncidentWorkspace>(p => p.Add(c => c.Id, id.Value));
        // The page is settled once the switching order is shown (the suspects come first, the order after:
        // each renders again); every click finds its element on the renderer's thread, so no render comes between.
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-testid=next-step]")), TimeSpan.FromMinutes(1));

        await cut.InvokeAsync(() => cut.Find("g[data-switch='LB-A1-3']").Click());

        cut.WaitForAssertion(() => Assert.Contains("Record that LB-A1-3 is found open?", cut.Find("[data-testid=switch-confirmation]").TextContent, StringComparison.Ordinal));
        Assert.Single(_board.Events(id));
        await cut.InvokeAsync(() => cut.Find("[data-testid=switch-cancel]").Click());
        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-testid=switch-confirmation]")));
        Assert.Single(_board.Events(id));

        await cut.InvokeAsync(() => cut.Find("g[data-switch='LB-A1-3']").Click());
        cut.WaitForElement("[data-testid=switch-confirm]");
        await cut.InvokeAsync(() => cut.Find("[data-testid=switch-confirm]").Click());

        var changed = Assert.IsType<SwitchStateChanged>(_board.Events(id)[^1].Event);
        Assert.Equal(new SwitchStateChanged(new SwitchId("LB-A1-3"), SwitchPosition.Open), changed);
    }

    protected override void Dispose(bool disposing)
    {
        base.Dispose(disposing);
        if (disposing)
        {
            _board.Dispose();
            _grids.Versions.Dispose();
            _ranker.Dispose();
            _database.Dispose();
        }
    }
}
