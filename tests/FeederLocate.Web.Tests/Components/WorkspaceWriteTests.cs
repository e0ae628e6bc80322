using System.Security.Claims;
using Bunit;
using Bunit.TestDoubles;
using FeederLocate.Storage.Incidents;
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

/// <summary>
/// The incident page's writes: a refused or failed change is shown as not saved and the controls go back to what
/// the log holds; an engineer retracts a wrong outcome. Real services over a fresh SQLite file.
/// </summary>
public sealed class WorkspaceWriteTests : BunitContext
{
    private static readonly DateTimeOffset Reported = new(2026, 11, 30, 6, 12, 0, TimeSpan.Zero);
    private readonly TempDatabase _database = new();
    private readonly IncidentStore _store;
    private readonly IncidentBoard _board;
    private readonly GridCatalog _grids;
    private readonly BunitAuthorizationContext _access;

    public WorkspaceWriteTests()
    {
        _grids = LoadedGrids.Samples(_database.Path);
        _store = IncidentStore.Open(_database.Path);
        _board = new IncidentBoard(_store, (name, version) => _grids.Find(name, version)?.Grid);
        WorkspaceServices.Add(Services, _grids, _board, new IncidentAnalysis(new GridLearning(_board), new CoreFaultRanker()));
        _access = AddAuthorization();
        _access.SetAuthorized("ana");
        _access.SetRoles("operator");
        _access.SetClaims(new Claim(AccountClaims.EveryGrid, "true"));
        SetRendererInfo(new Microsoft.AspNetCore.Components.RendererInfo("Server", isInteractive: true));
        JSInterop.Mode = JSRuntimeMode.Loose;
    }

    private IncidentId OpenIncident() =>
        _board.Open(_grids.Default!, new SwitchId("CB-A1"), FaultType.LG, Reported, new Actor("ana", "operator"));

    [Fact]
    public void Closing_a_normally_open_tie_into_a_loop_is_refused_on_the_page_and_the_switch_stays_open()
    {
        var id = OpenIncident();
        var cut = Render<IncidentWorkspace>(p => p.Add(c => c.Id, id.Value));
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("li[data-section]")), TimeSpan.FromMinutes(1));

        // NO-A1-A2 ties feeders A1 and A2 of the demo grid; both are fed, so closing it makes a loop.
        cut.InvokeAsync(() => cut.Find("g[data-switch='NO-A1-A2']").Click());
        cut.WaitForElement("[data-testid=switch-confirm]").Click();

        cut.WaitForAssertion(() => Assert.Contains("radial", cut.Find("[data-testid=not-saved]").TextContent, StringComparison.Ordinal), TimeSpan.FromMinutes(1));
        Assert.Contains("open", cut.Find("g[data-switch='NO-A1-A2']").ClassName, StringComparison.Ordinal);
        Assert.Equal(["incidentOpened"], _board.Events(id).Select(e => e.Kind));
    }

    [Fact]
    public void A_switch_suspect_is_recorded_in_one_click_and_a_confirmation_and_then_no_longer_suspected()
    {
        // The back-fed sample incident (sample-grid/README.md) without the tie's closing in the record.
        var ana = new Actor("ana", "operator");
        var id = _board.Open(_grids.Default!, new SwitchId("RC-B1-1"), FaultType.LL, Reported, ana);
        _board.Append(id, new SwitchStateChanged(new SwitchId("LB-A1-4"), SwitchPosition.Open), ana);
        foreach (var (indicator, state) in new[] { ("FPI-B1-01", IndicatorState.Forward), ("FPI-B1-04", IndicatorState.Fault), ("FPI-A1-16", IndicatorState.Forward), ("FPI-A1-14", IndicatorState.None), ("FPI-B1-11", IndicatorState.Forward), ("FPI-B1-14", IndicatorState.None) })
        {
            _board.Append(id, new IndicationEntered(new Indication(new IndicatorId(indicator), state, IndicationSource.Remote)), ana);
        }

        var cut = Render<IncidentWorkspace>(p => p.Add(c => c.Id, id.Value));
        cut.WaitForElement("[data-testid=switch-suspect-record-NO-A1-B1]", TimeSpan.FromMinutes(1)).Click();
        Assert.Equal("Record NO-A1-B1 closed", cut.WaitForElement("[data-testid=switch-confirm]").TextContent);
        cut.Find("[data-testid=switch-confirm]").Click();

        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-testid=switch-suspects]")), TimeSpan.FromMinutes(1));
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("li[data-section]")), TimeSpan.FromMinutes(1));
        Assert.Equal(new SwitchStateChanged(new SwitchId("NO-A1-B1"), SwitchPosition.Closed), _board.Events(id).Select(e => e.Event).OfType<SwitchStateChanged>().Last());
    }

    [Fact]
    public void When_the_log_cannot_be_written_the_page_says_not_saved_and_the_control_shows_the_stored_state()
    {
        var id = OpenIncident();
        var cut = Render<IncidentWorkspace>(p => p.Add(c => c.Id, id.Value));
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("li[data-section]")), TimeSpan.FromMinutes(1));
        File.Delete(_database.Path);

        cut.InvokeAsync(() => cut.Find("select[data-testid='state-FPI-A1-04']").Change("fault"));

        cut.WaitForAssertion(() => Assert.Contains("nothing more is saved", cut.Find("[data-testid=not-saved]").TextContent, StringComparison.Ordinal), TimeSpan.FromMinutes(1));
        // What the page renders is the stored state (the browser's own select is checked in WritesInTheBrowserTests).
        Assert.Equal("unknown", cut.Find("select[data-testid='state-FPI-A1-04']").GetAttribute("value"));
        Assert.Equal(["incidentOpened"], _board.Events(id).Select(e => e.Kind));
    }

    [Fact]
    public void On_a_full_disk_the_page_says_not_saved_and_saves_again_once_there_is_room()
    {
        var id = OpenIncident();
        // SQLite answers SQLITE_FULL once the file may not grow (sqlite.org/pragma.html#pragma_max_page_count).
        MaxPages(grow: false);
        // Fill what room the last pages still have, until the log refuses a write.
        var filler = new Actor("filler", "operator");
        var full = false;
        for (var round = 0; round < 10_000 && !full; round++)
        {
            try
            {
                _board.Append(id, new IndicationEntered(new Indication(new IndicatorId("FPI-A1-01"), round % 2 == 0 ? IndicatorState.Forward : IndicatorState.None, IndicationSource.Remote, null, false)), filler);
            }
            catch (Microsoft.Data.Sqlite.SqliteException)
            {
                full = true;
            }
        }

        Assert.True(full);
        var logged = _board.Events(id).Count;
        var cut = Render<IncidentWorkspace>(p => p.Add(c => c.Id, id.Value));
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("li[data-section]")), TimeSpan.FromMinutes(1));

        cut.InvokeAsync(() => cut.Find("select[data-testid='state-FPI-A1-04']").Change("fault"));
        cut.WaitForAssertion(() => Assert.Contains("disk holding the incident log is full", cut.Find("[data-testid=not-saved]").TextContent, StringComparison.Ordinal), TimeSpan.FromMinutes(1));
        Assert.Equal("unknown", cut.Find("select[data-testid='state-FPI-A1-04']").GetAttribute("value"));
        Assert.Equal(logged, _board.Events(id).Count);
        MaxPages(grow: true);
        cut.InvokeAsync(() => cut.Find("select[data-testid='state-FPI-A1-04']").Change("fault"));

        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-testid=not-saved]")), TimeSpan.FromMinutes(1));
        Assert.Equal(logged + 1, _board.Events(id).Count);
        Assert.Equal("fault", cut.Find("select[data-testid='state-FPI-A1-04']").GetAttribute("value"));
    }

    private void MaxPages(bool grow)
    {
        using var command = _store.Connection.CreateCommand();
        command.CommandText = "PRAGMA page_count";
        var pages = Convert.ToInt64(command.ExecuteScalar(), System.Globalization.CultureInfo.InvariantCulture);
        command.CommandText = $"PRAGMA max_page_count = {(grow ? 1073741823 : pages)}";
        command.ExecuteScalar();
    }

    [Fact]
    public void An_operator_is_not_offered_the_retraction()
    {
        var id = OpenIncident();
        _board.Append(id, new OutcomeLogged(new SegmentId("S109")), new Actor("ana", "operator"));

        var cut = Render<IncidentWorkspace>(p => p.Add(c => c.Id, id.Value));

        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-testid=logged-outcome]")), TimeSpan.FromMinutes(1));
        Assert.Empty(cut.FindAll("[data-testid=retraction]"));
    }

    [Fact]
    public void An_engineer_retracts_the_outcome_in_force_with_a_reason()
    {
        var id = OpenIncident();
        _board.Append(id, new OutcomeLogged(new SegmentId("S109")), new Actor("ana", "operator"));
        // An engineer's sign-in carries every role up to its own (AccountClaims.For).
        _access.SetAuthorized("eli");
        _access.SetRoles("viewer", "operator", "engineer");
        _access.SetClaims(new Claim(AccountClaims.EveryGrid, "true"));

        var cut = Render<IncidentWorkspace>(p => p.Add(c => c.Id, id.Value));
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-testid=retraction]")), TimeSpan.FromMinutes(1));
        Assert.True(cut.Find("[data-testid=retract-outcome]").HasAttribute("disabled"));
        cut.InvokeAsync(() => cut.Find("input[aria-label='reason for retracting']").Input("crew found the fault on S108"));
        cut.InvokeAsync(() => cut.Find("[data-testid=retract-outcome]").Click());

        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-testid=logged-outcome]")), TimeSpan.FromMinutes(1));
        Assert.Null(_board.State(id).Outcome);
        var last = _board.Events(id)[^1];
        Assert.Equal(("outcomeRetracted", "eli"), (last.Kind, last.Actor.Name));
    }

    protected override void Dispose(bool disposing)
    {
        base.Dispose(disposing);
        if (disposing)
        {
            _board.Dispose();
            _grids.Versions.Dispose();
            _database.Dispose();
        }
    }
}
