using System.Collections.Immutable;
using Bunit;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Web.Components.Workspace;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

public class CheckedSwitchingComponentTests : ComponentTest
{
    private readonly Services.LoadedGrid _grid = LoadedGrids.Sample("solid");

    private SwitchingPlan Plan()
    {
        var incident = new Incident(
            new DateTimeOffset(2026, 3, 1, 8, 0, 0, TimeSpan.Zero), null, ImmutableDictionary<SwitchId, SwitchPosition>.Empty,
            new SwitchId("CB-A1"), FaultType.LG, [],
            [
                new Indication(new IndicatorId("FPI-A1-04"), IndicatorState.Fault, IndicationSource.Remote),
                new Indication(new IndicatorId("FPI-A1-14"), IndicatorState.None, IndicationSource.Remote),
            ]);
        return SwitchingPlanner.Plan(_grid.Graph, incident, FaultRanking.Rank(_grid.Graph, incident));
    }

    [Fact]
    public void Switch_confirmation_names_the_device_and_the_new_position_and_raises_only_on_confirm()
    {
        SwitchPositionRequest? confirmed = null;
        var cancelled = false;
        var request = new SwitchPositionRequest(new SwitchId("LB-A1-3"), SwitchPosition.Open);

        var cut = Render<SwitchConfirmation>(p => p.Add(c => c.Pending, request)
            .Add(c => c.OnConfirm, r => confirmed = r).Add(c => c.OnCancel, () => cancelled = true));

        cut.Find("#switch-confirmation-question").MarkupMatches(
            "<p id=\"switch-confirmation-question\">Record that <strong>LB-A1-3</strong> is found <strong>open</strong>?\n" +
            "            The ranking and the switching order are made again from it.</p>");
        Assert.Equal("Record LB-A1-3 open", cut.Find("[data-testid=switch-confirm]").TextContent);
        cut.Find("[data-testid=switch-cancel]").Click();
        Assert.True(cancelled);
        Assert.Null(confirmed);
        cut.Find("[data-testid=switch-confirm]").Click();
        Assert.Equal(request, confirmed);
    }

    [Fact]
    public void Switch_confirmation_shows_nothing_while_no_click_waits()
    {
        var cut = Render<SwitchConfirmation>();

        cut.MarkupMatches(string.Empty);
    }

    [Fact]
    public void Step_correction_asks_for_a_reason_before_it_raises_the_request()
    {
        StepCorrectionRequest? raised = null;
        var cut = Render<StepCorrection>(p => p.Add(c => c.Order, 3).Add(c => c.OnCorrect, r => raised = r));

        cut.Find("[data-testid=correct-3]").Click();
        Assert.True(cut.Find("[data-testid=correct-confirm-3]").HasAttribute("disabled"));
        cut.Find("[data-testid=correct-reason-3]").Input("  ticked the wrong line ");
        cut.Find("[data-testid=correct-confirm-3]").Click();

        Assert.Equal(new StepCorrectionRequest(3, "ticked the wrong line"), raised);
        Assert.NotNull(cut.Find("[data-testid=correct-3]"));
    }

    [Fact]
    public void Plan_steps_show_the_refusal_and_offer_a_correction_on_a_done_step_only()
    {
        var plan = Plan();
        var first = plan.Steps[0];
        var done = new CompletedPlanStep(new PlanStepCompleted(first.Order, PlanSteps.ActionName(first.Action), first.Device?.Value),
            new Actor("ana", "operator"), new DateTimeOffset(2026, 3, 1, 8, 5, 0, TimeSpan.Zero));

        var cut = Render<PlanSteps>(p => p.Add(c => c.Plan, plan).Add(c => c.Done, [done])
            .Add(c => c.Refusal, "step 2 (open LB-A1-3) is not done yet: the steps are carried out in order")
            .Add(c => c.OnTick, _ => { }).Add(c => c.OnCorrect, _ => { }));

        cut.Find("[data-testid=tick-refusal]").MarkupMatches(
            "<p class=\"warning\" role=\"alert\" data-testid=\"tick-refusal\">Not ticked: step 2 (open LB-A1-3) is not done yet: the steps are carried out in order</p>");
        Assert.Single(cut.FindAll("[data-testid^=correct-]"));
        Assert.NotNull(cut.Find($"[data-testid=correct-{first.Order}]"));
    }

    [Fact]
    public void Plan_steps_for_a_viewer_offer_no_correction()
    {
        var plan = Plan();
        var first = plan.Steps[0];
        var done = new CompletedPlanStep(new PlanStepCompleted(first.Order, PlanSteps.ActionName(first.Action), first.Device?.Value),
            new Actor("ana", "operator"), new DateTimeOffset(2026, 3, 1, 8, 5, 0, TimeSpan.Zero));

        var cut = Render<PlanSteps>(p => p.Add(c => c.Plan, plan).Add(c => c.Done, [done]).Add(c => c.ReadOnly, true).Add(c => c.OnCorrect, _ => { }));

        Assert.Empty(cut.FindAll("[data-testid^=correct-]"));
    }

    [Fact]
    public void Deviation_form_needs_a_switch_and_a_reason_and_lists_the_deviations_logged()
    {
        DeviationRequest? raised = null;
        var logged = new RecordedDeviation(
            new SwitchingDeviationRecorded(new SwitchId("NO-A1-B1"), SwitchPosition.Closed, "school fed first", "closing NO-A1-B1 would energise the suspect section"),
            new Actor("eli", "engineer"), new DateTimeOffset(2026, 3, 1, 8, 40, 0, TimeSpan.Zero));

        var cut = Render<DeviationForm>(p => p.Add(c => c.Switches, [new SwitchId("LB-A1-3"), new SwitchId("NO-A1-B1")])
            .Add(c => c.Recorded, [logged]).Add(c => c.OnMeasurement, r => raised = r));

        Assert.True(cut.Find("[data-testid=deviation-record]").HasAttribute("disabled"));
        cut.Find("[data-testid=deviation-switch]").Change("LB-A1-3");
        Assert.True(cut.Find("[data-testid=deviation-record]").HasAttribute("disabled"));
        cut.Find("[data-testid=deviation-reason]").Input("crew found it jammed");
        cut.Find("[data-testid=deviation-record]").Click();

        Assert.Equal(new DeviationRequest(new SwitchId("LB-A1-3"), SwitchPosition.Open, "crew found it jammed"), raised);
        cut.Find("[data-testid=deviations] li").MarkupMatches(
            "<li>NO-A1-B1 closed by eli (engineer) at 08:40:00: school fed first (departs from: closing NO-A1-B1 would energise the suspect section)</li>");
    }
}
