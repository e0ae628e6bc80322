using Bunit;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.Components.Workspace;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

public class LifecycleComponentTests : ComponentTest
{
    private static readonly DateTimeOffset At = new(2026, 3, 1, 8, 0, 0, TimeSpan.Zero);
    private static readonly Actor Ana = new("ana", "operator");

    [Fact]
    public void Lifecycle_panel_lists_each_stage_with_who_and_when_and_offers_only_the_later_stages()
    {
        IncidentStage? moved = null;
        var cut = Render<LifecyclePanel>(p => p.Add(c => c.Stage, IncidentStage.Located)
            .Add(c => c.Stages, [new StageChange(IncidentStage.Open, Ana, At), new StageChange(IncidentStage.Located, Ana, At.AddMinutes(12))])
            .Add(c => c.MayOperate, true).Add(c => c.OnMove, s => moved = s));

        cut.Find("[data-testid=stage-history]").MarkupMatches(
            "<ol class=\"stages\" data-testid=\"stage-history\"><li>open · ana (operator) · 2026-03-01 08:00:00 UTC</li><li>located · ana (operator) · 2026-03-01 08:12:00 UTC</li></ol>");
        Assert.Equal(["stage-isolated", "stage-restored", "stage-repaired"], cut.FindAll(".moves button").Select(b => b.GetAttribute("data-testid")));
        Assert.True(cut.Find("[data-testid=close-incident]").HasAttribute("disabled"));
        cut.Find("[data-testid=stage-restored]").Click();
        Assert.Equal(IncidentStage.Restored, moved);
    }

    [Fact]
    public void After_the_repair_the_panel_lists_the_switches_still_off_normal_and_closes_with_the_outcome()
    {
        var closed = false;
        var cut = Render<LifecyclePanel>(p => p.Add(c => c.Stage, IncidentStage.Repaired)
            .Add(c => c.Stages, [new StageChange(IncidentStage.Repaired, Ana, At)])
            .Add(c => c.OffNormal, [(new SwitchId("CB-A1"), SwitchPosition.Open, SwitchPosition.Closed)])
            .Add(c => c.HasOutcome, true).Add(c => c.MayOperate, true)
            .Add(c => c.OnClose, _ => closed = true));

        Assert.Contains("CB-A1 is open, normally closed", cut.Find("[data-testid=off-normal]").TextContent, StringComparison.Ordinal);
        // The switches go back through the return order's ticks, not from here.
        Assert.Empty(cut.FindAll("[data-testid='normal-CB-A1']"));
        cut.Find("[data-testid=close-incident]").Click();
        Assert.True(closed);
    }

    [Fact]
    public void A_closed_incident_is_read_only_and_only_a_reopening_with_a_reason_is_offered()
    {
        string? reason = null;
        var cut = Render<LifecyclePanel>(p => p.Add(c => c.Stage, IncidentStage.Closed)
            .Add(c => c.Stages, [new StageChange(IncidentStage.Closed, Ana, At)])
            .Add(c => c.MayOperate, true).Add(c => c.MayReopen, true).Add(c => c.OnReopen, r => reason = r));

        Assert.NotNull(cut.Find("[data-testid=closed-read-only]"));
        Assert.Empty(cut.FindAll(".moves button"));
        Assert.True(cut.Find("[data-testid=reopen]").HasAttribute("disabled"));
        cut.Find("[data-testid=reopen-reason]").Input("fault came back");
        cut.Find("[data-testid=reopen]").Click();
        Assert.Equal("fault came back", reason);
    }

    [Fact]
    public void Indicator_entry_shows_who_entered_each_reading_and_that_it_overrode_another_operators()
    {
        var grid = LoadedGrids.Sample("solid").Grid;
        var indicator = grid.Indicators.First(i => !i.Directional);
        var first = new IndicationEntry(new Indication(indicator.Id, IndicatorState.Fault, IndicationSource.Remote), Ana, At);
        var second = new IndicationEntry(new Indication(indicator.Id, IndicatorState.None, IndicationSource.Remote), new Actor("ben", "operator"), At.AddSeconds(9), first);

        var cut = Render<IndicatorEntry>(p => p.Add(c => c.Indicators, [indicator])
            .Add(c => c.Current, new Dictionary<IndicatorId, Indication> { [indicator.Id] = second.Indication })
            .Add(c => c.Entries, new Dictionary<IndicatorId, IndicationEntry> { [indicator.Id] = second }));

        cut.Find($"[data-testid='override-{indicator.Id}']").MarkupMatches(
            $"<span class=\"override\" role=\"status\" data-testid=\"override-{indicator.Id}\">overrode ana (operator)'s fault of 08:00:00</span>");
        Assert.StartsWith("ben (operator) at 08:00:09", cut.Find($"[data-testid='entered-{indicator.Id}']").TextContent.Trim(), StringComparison.Ordinal);
    }

    [Fact]
    public void Times_form_shows_the_times_given_and_raises_them_in_utc()
    {
        IncidentTimesEntered? entered = null;
        var cut = Render<IncidentTimesForm>(p => p.Add(c => c.Times, new IncidentTimes(At, null, null)).Add(c => c.MayOperate, true).Add(c => c.OnEnter, e => entered = e));

        Assert.Equal("Fault 2026-03-01 08:00:00 · trip not given · reclosure not given", cut.Find("[data-testid=times-entered]").TextContent);
        cut.Find("[data-testid=times-trip]").Change("2026-03-01T08:00:02");
        cut.Find("[data-testid=times-enter]").Click();
        Assert.Equal(new IncidentTimesEntered(null, new DateTimeOffset(2026, 3, 1, 8, 0, 2, TimeSpan.Zero), null), entered);
    }

    [Fact]
    public void Outcome_form_offers_the_incidents_fault_type_first()
    {
        OutcomeLogged? logged = null;
        var cut = Render<OutcomeForm>(p => p.Add(c => c.Segments, [new SegmentId("S109")]).Add(c => c.FaultType, FaultType.LLG).Add(c => c.OnLog, o => logged = o));

        cut.Find("[data-testid='outcome-segment']").Change("S109");
        cut.Find("[data-testid='log-outcome']").Click();

        Assert.Equal(new OutcomeLogged(new SegmentId("S109"), FaultType.LLG), logged);
    }
}
