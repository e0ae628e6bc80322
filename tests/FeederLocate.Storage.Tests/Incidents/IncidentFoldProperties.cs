using CsCheck;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Storage.Tests.Support;

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

    private static StoredEvent Stored(int index, IncidentEvent e) =>
        new(new EventId(index + 1), new IncidentId(1), index + 1, ManualClock.Start.AddMinutes(index), new Actor("test"), e);
}
