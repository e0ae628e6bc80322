using CsCheck;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Tests.Incidents;

public class IncidentFoldProperties
{
    private static readonly Gen<IndicationEntered> Indications =
        Gen.Select(
            Gen.Int[1, 4].Select(i => new IndicatorId($"FI{i}")),
            Gen.Enum<IndicatorState>(),
            Gen.Enum<IndicationSource>(),
            Gen.Bool,
            (id, state, source, suspect) => new IndicationEntered(new Indication(id, state, source, Suspect: suspect)));

    [Fact]
    public void Each_indicator_keeps_its_last_indication_and_is_listed_once()
    {
        Indications.List[0, 30].Sample(entered =>
        {
            var events = new List<StoredEvent> { Stored(0, new IncidentOpened(TestGrids.BrackenfoldName, TestIncidents.EarthFault())) };
            events.AddRange(entered.Select((e, i) => Stored(i + 1, e)));

            var state = IncidentFold.Fold(events);

            var opening = TestIncidents.EarthFault().Indications;
            var ids = opening.Select(i => i.Indicator).Concat(entered.Select(e => e.Indication.Indicator)).Distinct().ToList();
            Assert.Equal(ids, state.Incident.Indications.Select(i => i.Indicator));
            foreach (var id in ids)
            {
                var last = entered.LastOrDefault(e => e.Indication.Indicator == id)?.Indication ?? opening.Single(i => i.Indicator == id);
                Assert.Equal(last, state.Incident.IndicationOf(id));
            }
        });
    }

    private static readonly Gen<IncidentEvent> AnyChange = Gen.OneOf<IncidentEvent>(
        Indications.Select(i => (IncidentEvent)i),
        Gen.Select(Gen.Double[0, 5000], Gen.Bool, (current, residual) =>
            (IncidentEvent)new MeasurementRecorded(new SubstationMeasurement(new SwitchId("CB1"), residual ? null : current, residual ? current / 50 : null))),
        Gen.Bool.Select(open => (IncidentEvent)new SwitchStateChanged(new SwitchId("LB2"), open ? SwitchPosition.Open : SwitchPosition.Closed)),
        Gen.Int[1, 9].Select(order => (IncidentEvent)new PlanStepCompleted(order, "open", "LB2")),
        Gen.Enum<FaultType>().Select(type => (IncidentEvent)new SubstationRecordAmended(new SwitchId("CB1"), type)),
        Gen.Const((IncidentEvent)new OutcomeLogged(new SegmentId("S2"), FaultType.LG, "cable joint")));

    [Fact]
    public void Continuing_from_the_state_at_any_point_gives_the_state_of_folding_every_event()
    {
        Gen.Select(AnyChange.List[0, 25], Gen.Int[0, 100], Gen.Bool).Sample((changes, splitPercent, close) =>
        {
            var events = new List<StoredEvent> { Stored(0, new IncidentOpened(TestGrids.BrackenfoldName, TestIncidents.EarthFault())) };
            events.AddRange(changes.Select((e, i) => Stored(i + 1, e)));
            if (close)
            {
                events.Add(Stored(events.Count, new IncidentClosed()));
            }

            var split = 1 + (events.Count - 1) * splitPercent / 100;

            var whole = IncidentFold.Fold(events);
            var continued = IncidentFold.Continue(IncidentFold.Fold(events.GetRange(0, split)), events, split);

            Assert.Equal(TestIncidents.Text(whole.Incident), TestIncidents.Text(continued.Incident));
            Assert.Equal(whole.CompletedSteps.ToArray(), continued.CompletedSteps.ToArray());
            Assert.Equal((whole.Status, whole.Outcome, whole.ClosedAt, whole.EventCount), (continued.Status, continued.Outcome, continued.ClosedAt, continued.EventCount));
        });
    }

    private static StoredEvent Stored(int index, IncidentEvent e) =>
        new(new EventId(index + 1), new IncidentId(1), index + 1, TestClock.Start.AddMinutes(index), new Actor("test"), e);
}
