using System.Collections.Immutable;
using Bunit;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Components.Workspace;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

public class ProtectionPanelTests : ComponentTest
{
    private static readonly DateTimeOffset ReportedAt = new(2026, 3, 1, 8, 0, 0, TimeSpan.Zero);

    private static Incident Incident(params Indication[] indications) =>
        new(ReportedAt, null, ImmutableDictionary<SwitchId, SwitchPosition>.Empty, new SwitchId("CB-A1"), FaultType.LG, [], [.. indications]);

    private IRenderedComponent<ProtectionPanel> Panel(Incident incident, Action<ProtectionRecorded> record) =>
        Render<ProtectionPanel>(p => p
            .Add(c => c.Reclosers, [new SwitchId("CB-A1"), new SwitchId("RC-B1-1")])
            .Add(c => c.Fuses, [new SwitchId("FU-A1-6")])
            .Add(c => c.Current, incident)
            .Add(c => c.Now, ReportedAt.AddMinutes(30))
            .Add(c => c.OnProtection, record));

    [Fact]
    public void The_panel_raises_fault_time_reclosing_fuse_and_relay_as_protection_events()
    {
        var recorded = new List<ProtectionRecorded>();
        var cut = Panel(Incident(), recorded.Add);

        cut.Find("[data-testid='protection-fault-at']").Change("2026-03-01T07:58:30");
        cut.Find("[data-testid='protection-set-fault-at']").Click();
        cut.Find("[data-testid='protection-reclosing-device']").Change("RC-B1-1");
        cut.Find("[data-testid='protection-attempts']").Change("2");
        cut.Find("[data-testid='protection-result']").Change("success");
        cut.Find("[data-testid='protection-set-reclosing']").Click();
        cut.Find("[data-testid='protection-fuse-condition']").Change("intact");
        cut.Find("[data-testid='protection-set-fuse']").Click();
        cut.Find("[data-testid='protection-direction']").Change("forward");
        cut.Find("[data-testid='protection-reactance']").Change("2.8");
        cut.Find("[data-testid='protection-set-relay']").Click();

        Assert.Equal(4, recorded.Count);
        Assert.Equal(new DateTimeOffset(2026, 3, 1, 7, 58, 30, TimeSpan.Zero), recorded[0].FaultAt);
        Assert.Equal(new Reclosing(new SwitchId("RC-B1-1"), 2, ReclosingResult.Success), recorded[1].Reclosing);
        Assert.Equal(FuseCondition.Intact, recorded[2].Fuses[new SwitchId("FU-A1-6")]);
        Assert.Equal(new RelayResult(new SwitchId("CB-A1"), EarthFaultDirection.Forward, 2.8), Assert.Single(recorded[3].Relays));
        Assert.Empty(cut.FindAll("[data-testid='protection-error']"));
    }

    [Fact]
    public void A_fault_time_later_than_now_or_after_a_reading_is_refused_with_a_message()
    {
        var recorded = new List<ProtectionRecorded>();
        var read = new Indication(new IndicatorId("FPI-A1-01"), IndicatorState.Forward, IndicationSource.Remote, ReportedAt.AddMinutes(-1));
        var cut = Panel(Incident(read), recorded.Add);

        cut.Find("[data-testid='protection-fault-at']").Change("2026-03-01T09:00:00");
        cut.Find("[data-testid='protection-set-fault-at']").Click();
        var future = cut.Find("[data-testid='protection-error']").TextContent;
        cut.Find("[data-testid='protection-fault-at']").Change("2026-03-01T07:59:30");
        cut.Find("[data-testid='protection-set-fault-at']").Click();

        Assert.Empty(recorded);
        Assert.Contains("later than now", future, StringComparison.Ordinal);
        cut.Find("[data-testid='protection-error']").MarkupMatches(
            "<p class=\"error\" role=\"alert\" data-testid=\"protection-error\">indicator FPI-A1-01 was read at 2026-03-01 07:59:00 UTC, before 2026-03-01 07:59:30 UTC: give the fault time the readings allow</p>");
    }

    [Fact]
    public void The_panel_shows_what_is_known_and_the_ranked_list_marks_a_transient_fault()
    {
        var incident = Incident() with
        {
            FaultAt = ReportedAt.AddMinutes(-2),
            Reclosing = new Reclosing(new SwitchId("RC-B1-1"), 1, ReclosingResult.Success),
            Fuses = ImmutableDictionary<SwitchId, FuseCondition>.Empty.Add(new SwitchId("FU-A1-6"), FuseCondition.Blown),
            Relays = [new RelayResult(new SwitchId("CB-A1"), EarthFaultDirection.Reverse, null)],
        };
        var panel = Panel(incident, _ => { });
        var ranking = new RankingResult(true, [], [], [], [], [], [], ImmutableDictionary<FaultType, double>.Empty, []) { Transient = true };

        var list = Render<RankedList>(p => p.Add(c => c.Ranking, ranking));

        var known = panel.Find("[data-testid='protection-known']").TextContent;
        Assert.Contains("2026-03-01 07:58:00 UTC", known, StringComparison.Ordinal);
        Assert.Contains("RC-B1-1: 1 reclosure(s), success (transient fault)", known, StringComparison.Ordinal);
        Assert.Contains("FU-A1-6 blown", known, StringComparison.Ordinal);
        Assert.Contains("CB-A1 reverse", known, StringComparison.Ordinal);
        Assert.Contains("Transient fault", list.Find("[data-testid='transient']").TextContent, StringComparison.Ordinal);
    }
}
