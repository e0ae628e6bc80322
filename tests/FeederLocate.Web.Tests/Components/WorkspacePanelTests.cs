using System.Collections.Immutable;
using Bunit;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Components.OneLine;
using FeederLocate.Web.Components.Workspace;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

public class WorkspacePanelTests : ComponentTest
{
    private readonly Services.LoadedGrid _grid = LoadedGrids.Sample("solid");

    [Fact]
    public void Indicator_entry_offers_only_the_states_of_each_kind_and_raises_the_choice()
    {
        (Indicator Indicator, IndicatorState State, bool Distrusted, TimeOnly? ReadAt)? set = null;
        var cut = Render<IndicatorEntry>(p => p
            .Add(c => c.Indicators, _grid.Grid.Indicators)
            .Add(c => c.Current, new Dictionary<IndicatorId, Indication>())
            .Add(c => c.OnSet, e => set = e));

        var directional = cut.Find("select[data-testid='state-FPI-A1-01']");
        Assert.Equal(["unknown", "forward", "reverse", "none"], directional.QuerySelectorAll("option").Select(o => o.TextContent));
        cut.Find("select[data-testid='state-FPI-A1-04']").Change("fault");

        Assert.NotNull(set);
        Assert.Equal(new IndicatorId("FPI-A1-04"), set.Value.Indicator.Id);
        Assert.Equal(IndicatorState.Fault, set.Value.State);
        Assert.False(set.Value.Distrusted);
    }

    [Fact]
    public void Ranked_list_shows_bars_with_their_value_and_the_inconsistency_warning()
    {
        var check = new IndicationCheck(new IndicatorId("FPI-A1-14"), IndicatorState.Forward, IndicatorState.None, false, 0.01, 0.03, false, "reported without cause (false report)");
        var ranking = new RankingResult(
            false,
            [new RankedSegment(new SegmentId("S109"), new SectionId("SEC-S108"), 0.6), new RankedSegment(new SegmentId("S112"), new SectionId("SEC-S112"), 0.4)],
            [new RankedSection(new SectionId("SEC-S108"), [new SegmentId("S108"), new SegmentId("S109")], 0.6),
             new RankedSection(new SectionId("SEC-S112"), [new SegmentId("S112")], 0.4)],
            [], [check], [], [], ImmutableDictionary<FaultType, double>.Empty, []);

        var cut = Render<RankedList>(p => p.Add(c => c.Ranking, ranking));

        Assert.Equal("60", cut.Find("li[data-section='SEC-S108'] .bar").GetAttribute("aria-valuenow"));
        Assert.Contains("FPI-A1-14: recorded forward, expected none", cut.Find("[data-testid='inconsistent']").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Ranked_list_shows_a_cross_country_pair_instead_of_the_single_fault_warning()
    {
        var pair = new CrossCountrySuspect(new SegmentId("S105"), new SegmentId("S206"), 0.7)
        {
            FirstSection = new SectionId("SEC-S105"),
            SecondSection = new SectionId("SEC-S206"),
        };
        var ranking = new RankingResult(
            false,
            [new RankedSegment(new SegmentId("S105"), new SectionId("SEC-S105"), 0.5), new RankedSegment(new SegmentId("S206"), new SectionId("SEC-S206"), 0.5)],
            [new RankedSection(new SectionId("SEC-S105"), [new SegmentId("S105")], 0.5), new RankedSection(new SectionId("SEC-S206"), [new SegmentId("S206")], 0.5)],
            [], [], [pair], [], ImmutableDictionary<FaultType, double>.Empty, [])
        {
            CrossCountryProbability = 0.9,
        };

        var cut = Render<RankedList>(p => p.Add(c => c.Ranking, ranking).Add(c => c.SegmentNames, _grid.SegmentNames));

        var warning = cut.Find("[data-testid='cross-country']");
        Assert.Contains("no single fault explains the evidence", warning.TextContent, StringComparison.Ordinal);
        var first = _grid.SegmentNames[new SegmentId("S105")];
        var second = _grid.SegmentNames[new SegmentId("S206")];
        Assert.StartsWith("A1: ", first, StringComparison.Ordinal);
        Assert.StartsWith("A2: ", second, StringComparison.Ordinal);
        cut.Find("li[data-pair='S105+S206']").MarkupMatches(
            $"<li data-pair=\"S105+S206\" title=\"S105 (SEC-S105) + S206 (SEC-S206)\">{first} + {second}: 70 %</li>");
        Assert.Empty(cut.FindAll("[data-testid='inconsistent']"));
    }

    [Fact]
    public void Ranked_list_says_why_there_is_no_ranking()
    {
        var cut = Render<RankedList>(p => p.Add(c => c.Problem, "the switching state closes a loop"));

        cut.Find("p.warning").MarkupMatches("<p class=\"warning\" role=\"alert\">The incident cannot be ranked: the switching state closes a loop</p>");
    }

    [Fact]
    public void Outcome_form_logs_the_confirmed_segment_type_and_cause()
    {
        OutcomeLogged? logged = null;
        var cut = Render<OutcomeForm>(p => p
            .Add(c => c.Segments, [.. _grid.Grid.Segments.Select(s => s.Id)])
            .Add(c => c.OnLog, o => logged = o));

        Assert.True(cut.Find("[data-testid='log-outcome']").HasAttribute("disabled"));
        cut.Find("[data-testid='outcome-segment']").Change("S109");
        cut.Find("select[aria-label='confirmed fault type']").Change("LG");
        cut.Find("input[aria-label='cause']").Change("  tree contact ");
        cut.Find("[data-testid='log-outcome']").Click();

        Assert.Equal(new OutcomeLogged(new SegmentId("S109"), FaultType.LG, "tree contact", null), logged);
    }

    [Fact]
    public void Legend_explains_every_indicator_state_and_switch_kind_in_words()
    {
        var cut = Render<Legend>();

        var text = cut.Find("[data-testid='legend']").TextContent;
        foreach (var word in new[] { "fault", "forward", "reverse", "none", "unknown", "breaker", "recloser", "load-break switch", "disconnector", "fuse", "cable", "overhead line", "open switch", "closed switch", "suspect" })
        {
            Assert.Contains(word, text, StringComparison.Ordinal);
        }
    }
}

public class RecordAndPlanPanelTests : ComponentTest
{
    private readonly Services.LoadedGrid _grid = LoadedGrids.Sample("solid");

    [Fact]
    public void Record_form_amends_tripped_device_and_fault_type_and_enters_currents()
    {
        FeederLocate.Storage.Events.TripAmended? amended = null;
        SubstationMeasurement? measured = null;
        var cut = Render<MeasurementForm>(p => p
            .Add(c => c.Breakers, [new SwitchId("CB-A1"), new SwitchId("CB-A2")])
            .Add(c => c.ProtectiveDevices, [new SwitchId("CB-A1"), new SwitchId("RC-B1-1")])
            .Add(c => c.TrippedDevice, new SwitchId("CB-A1"))
            .Add(c => c.FaultType, (FaultType?)null)
            .Add(c => c.OnAmend, a => amended = a)
            .Add(c => c.OnMeasurement, m => measured = m));

        Assert.Equal("CB-A1", cut.Find("[data-testid='record-tripped']").GetAttribute("value"));
        cut.Find("[data-testid='record-tripped']").Change("RC-B1-1");
        cut.Find("[data-testid='record-type']").Change("LLL");
        cut.Find("[data-testid='record-amend']").Click();
        cut.Find("input[aria-label='phase current A']").Change("2140");
        cut.FindAll("button").Single(b => b.TextContent == "Enter record").Click();

        Assert.Equal(new FeederLocate.Storage.Events.TripAmended(new SwitchId("RC-B1-1"), FaultType.LLL), amended);
        Assert.Equal(new SubstationMeasurement(new SwitchId("CB-A1"), 2140), measured);
    }

    [Fact]
    public void Plan_steps_list_every_step_with_its_reason_and_show_who_ticked_a_done_one()
    {
        var ranking = FaultRanking.Rank(_grid.Graph, Incidents.Trip());
        var plan = FeederLocate.Core.Switching.SwitchingPlanner.Plan(_grid.Graph, Incidents.Trip(), ranking);
        var first = plan.Steps[0];
        var done = new FeederLocate.Storage.Incidents.CompletedPlanStep(
            new PlanStepCompleted(first.Order, PlanSteps.ActionName(first.Action), first.Device?.Value), new Actor("ana"), new DateTimeOffset(2026, 3, 1, 8, 5, 0, TimeSpan.Zero));
        FeederLocate.Core.Switching.SwitchingStep? ticked = null;

        var cut = Render<PlanSteps>(p => p.Add(c => c.Plan, plan).Add(c => c.Done, [done]).Add(c => c.OnTick, s => ticked = s));

        Assert.Equal(plan.Steps.Length, cut.FindAll("ol.steps > li").Count);
        Assert.Contains("done by ana at 08:05:00", cut.Find($"[data-testid='done-{first.Order}']").TextContent, StringComparison.Ordinal);
        Assert.True(cut.Find($"[data-testid='tick-{first.Order}']").HasAttribute("disabled"));
        Assert.Contains(plan.Steps, s => s.Action == FeederLocate.Core.Switching.StepAction.ProveDead);
        Assert.Contains("prove dead", cut.Find("[data-testid='plan-steps']").TextContent, StringComparison.OrdinalIgnoreCase);
        Assert.Contains("from the curve", cut.Find("[data-testid='cold-load']").TextContent, StringComparison.Ordinal);
        cut.Find($"[data-testid='tick-{plan.Steps[1].Order}']").Change(true);
        Assert.Equal(plan.Steps[1], ticked);
    }

    [Fact]
    public void Plan_steps_for_a_viewer_show_who_did_what_but_offer_no_tick()
    {
        var ranking = FaultRanking.Rank(_grid.Graph, Incidents.Trip());
        var plan = FeederLocate.Core.Switching.SwitchingPlanner.Plan(_grid.Graph, Incidents.Trip(), ranking);
        var first = plan.Steps[0];
        var done = new FeederLocate.Storage.Incidents.CompletedPlanStep(
            new PlanStepCompleted(first.Order, PlanSteps.ActionName(first.Action), first.Device?.Value), new Actor("ana", "operator"), new DateTimeOffset(2026, 3, 1, 8, 5, 0, TimeSpan.Zero));

        var cut = Render<PlanSteps>(p => p.Add(c => c.Plan, plan).Add(c => c.Done, [done]).Add(c => c.ReadOnly, true));

        Assert.All(cut.FindAll("input[type=checkbox]"), box => Assert.True(box.HasAttribute("disabled")));
        Assert.Contains("done by ana (operator) at 08:05:00", cut.Find($"[data-testid='done-{first.Order}']").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Return_steps_wait_for_the_outcome_then_are_ticked_in_their_own_list_with_who_and_when()
    {
        var ranking = FaultRanking.Rank(_grid.Graph, Incidents.Trip());
        var plan = FeederLocate.Core.Switching.SwitchingPlanner.Plan(_grid.Graph, Incidents.Trip(), ranking);
        var back = FeederLocate.Core.Switching.SwitchingPlanner.PlanReturn(_grid.Graph, Incidents.Trip(), plan);
        FeederLocate.Core.Switching.SwitchingStep? ticked = null;

        var before = Render<ReturnSteps>();
        Assert.Contains("follows the outcome", before.Find("[data-testid='return-waiting']").TextContent, StringComparison.Ordinal);

        var first = back.Steps[0];
        var done = new FeederLocate.Storage.Incidents.CompletedPlanStep(
            new PlanStepCompleted(first.Order, FeederLocate.Application.Switching.CheckedSwitching.ActionName(first.Action), first.Device?.Value),
            new Actor("ana", "operator"), new DateTimeOffset(2026, 3, 1, 9, 40, 0, TimeSpan.Zero));
        var after = Render<ReturnSteps>(p => p.Add(c => c.Attempt, new FeederLocate.Application.Analysis.ReturnAttempt(back, null))
            .Add(c => c.Done, [done]).Add(c => c.OnTick, s => ticked = s));
        Assert.Equal(back.Steps.Length, after.FindAll("ol.steps > li").Count);
        Assert.Contains("removeEarth", after.Markup, StringComparison.Ordinal);
        Assert.Contains("Advice only", after.Find("[data-testid='return-steps']").TextContent, StringComparison.Ordinal);
        Assert.Contains("done by ana (operator) at 09:40 UTC", after.Find($"[data-testid='return-done-{first.Order}']").TextContent, StringComparison.Ordinal);
        Assert.True(after.Find($"[data-testid='return-tick-{first.Order}']").HasAttribute("disabled"));
        after.Find($"[data-testid='return-tick-{back.Steps[1].Order}']").Change(true);
        Assert.Equal(back.Steps[1], ticked);

        var early = Render<ReturnSteps>(p => p.Add(c => c.Attempt, new FeederLocate.Application.Analysis.ReturnAttempt(back, null))
            .Add(c => c.NotYet, "the return to normal follows the repair: move the incident to repaired first"));
        Assert.All(early.FindAll("input[type=checkbox]"), box => Assert.True(box.HasAttribute("disabled")));
        Assert.Contains("follows the repair", early.Find("[data-testid='return-not-yet']").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void The_outcome_form_offers_no_fault_found_and_transient_with_the_incidents_fault_type()
    {
        OutcomeLogged? logged = null;
        NoFaultFoundLogged? none = null;
        var cut = Render<OutcomeForm>(p => p.Add(c => c.Segments, [new SegmentId("S109")]).Add(c => c.FaultType, FaultType.LL)
            .Add(c => c.OnLog, o => logged = o).Add(c => c.OnNoFault, n => none = n));

        Assert.Equal("LL", cut.Find("[data-testid=outcome-type]").GetAttribute("value"));
        Assert.True(cut.Find("[data-testid=log-outcome]").HasAttribute("disabled"));
        cut.Find("[data-testid=outcome-finding]").Change("transient");
        Assert.True(cut.Find("[data-testid=outcome-segment]").HasAttribute("disabled"));
        cut.Find("[data-testid=log-outcome]").Click();

        Assert.Null(logged);
        Assert.Equal(new NoFaultFoundLogged(true, FaultType.LL), none);

        var shown = Render<OutcomeForm>(p => p.Add(c => c.Segments, [new SegmentId("S109")]).Add(c => c.NoFaultFound, new NoFaultFoundLogged(false, FaultType.LG, "patrolled twice")));
        Assert.Contains("no fault found (LG), patrolled twice", shown.Find("[data-testid=logged-outcome]").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void A_standing_earth_fault_with_a_split_ranking_shows_the_search_first()
    {
        var grid = SampleGrids.Grid("resonant");
        var graph = new FeederLocate.Core.Topology.NetworkGraph(grid);
        var incident = FeederLocate.Core.Formats.IncidentReader.Parse(
            File.ReadAllText(SampleGrids.IncidentPath("resonant-standing-earth-fault-b1")), grid).ValueOrThrow();
        var plan = FeederLocate.Core.Switching.SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));
        Assert.True(plan.SearchFirst);

        var cut = Render<PlanSteps>(p => p.Add(c => c.Plan, plan));

        Assert.Contains("Search first", cut.Find("[data-testid='search-first']").TextContent, StringComparison.Ordinal);
        Assert.Contains("Earth-fault search (first)", cut.Markup, StringComparison.Ordinal);
    }

    [Fact]
    public void A_cross_country_plan_names_both_isolated_sections()
    {
        var grid = SampleGrids.Grid("isolated");
        var graph = new FeederLocate.Core.Topology.NetworkGraph(grid);
        var incident = FeederLocate.Core.Formats.IncidentReader.Parse(
            File.ReadAllText(SampleGrids.IncidentPath("isolated-cross-country-a1-a2")), grid).ValueOrThrow();
        var plan = FeederLocate.Core.Switching.SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));

        var cut = Render<PlanSteps>(p => p.Add(c => c.Plan, plan));

        Assert.Contains("Isolate SEC-S105; SEC-S206", cut.Find("[data-testid='plan-steps']").TextContent, StringComparison.Ordinal);
    }

    private static class Incidents
    {
        /// <summary>CB-A1 tripped on an earth fault; the indicators on A1 saw it up to FPI-A1-11, not beyond.</summary>
        public static Incident Trip() => new(
            new DateTimeOffset(2026, 3, 1, 8, 0, 0, TimeSpan.Zero), null, ImmutableDictionary<SwitchId, SwitchPosition>.Empty,
            new SwitchId("CB-A1"), FaultType.LG, [],
            [
                new Indication(new IndicatorId("FPI-A1-01"), IndicatorState.Forward, IndicationSource.Remote),
                new Indication(new IndicatorId("FPI-A1-04"), IndicatorState.Fault, IndicationSource.Remote),
                new Indication(new IndicatorId("FPI-A1-11"), IndicatorState.Forward, IndicationSource.Remote),
                new Indication(new IndicatorId("FPI-A1-14"), IndicatorState.None, IndicationSource.Remote),
            ]);
    }
}
