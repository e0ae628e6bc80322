using FeederLocate.Application.Evidence;
using FeederLocate.Application.Tests.Support;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;

namespace FeederLocate.Application.Tests.Evidence;

public sealed class EvidenceIntakeTests : IDisposable
{
    private readonly TestLog _test = new();
    private readonly Grid _grid = Samples.Graph("solid").Grid;

    public void Dispose() => _test.Dispose();

    private Storage.Incidents.IncidentId OpenTrip() =>
        _test.Log.Open(_grid, new SwitchId("CB-A1"), FaultType.LG, new DateTimeOffset(2026, 11, 30, 6, 12, 0, TimeSpan.Zero), Samples.Operator);

    [Fact]
    public void One_indication_object_or_an_array_is_logged_item_by_item()
    {
        var id = OpenTrip();
        var intake = new EvidenceIntake(_test.Log);

        var one = intake.AddIndications(id, _grid, """{ "indicator": "FPI-A1-04", "state": "fault", "source": "remote" }""", Samples.Operator);
        var two = intake.AddMeasurements(id, _grid, """[ { "device": "CB-A1", "phaseCurrentA": 1880 }, { "device": "CB-B1", "neutralVoltageV": 0 } ]""", Samples.Operator);

        Assert.Equal((1, 2), (one.Accepted, two.Accepted));
        Assert.Equal(4, _test.Log.Events(id).Count);
        var state = _test.Log.State(id);
        Assert.Equal(IndicatorState.Fault, state.Incident.IndicationOf(new IndicatorId("FPI-A1-04"))!.State);
        Assert.Equal(1880, state.Incident.Measurements.Single(m => m.Device == new SwitchId("CB-A1")).PhaseCurrentA);
    }

    [Fact]
    public void An_item_that_does_not_mention_suspect_keeps_the_operators_distrust_mark_and_an_explicit_false_clears_it()
    {
        var id = OpenTrip();
        var intake = new EvidenceIntake(_test.Log);
        _test.Log.Append(id, new IndicationEntered(new Indication(new IndicatorId("FPI-A1-04"), IndicatorState.None, IndicationSource.Remote, Distrusted: true)), Samples.Operator);

        intake.AddIndications(id, _grid, """[{"indicator":"FPI-A1-04","state":"fault","source":"remote"}]""", Samples.Operator);
        var kept = _test.Log.State(id).Incident.IndicationOf(new IndicatorId("FPI-A1-04"))!;
        intake.AddIndications(id, _grid, """{"indicator":"FPI-A1-04","state":"fault","source":"remote","suspect":false}""", Samples.Operator);
        var cleared = _test.Log.State(id).Incident.IndicationOf(new IndicatorId("FPI-A1-04"))!;

        Assert.Equal((IndicatorState.Fault, true), (kept.State, kept.Distrusted));
        Assert.Equal((IndicatorState.Fault, false), (cleared.State, cleared.Distrusted));
    }

    [Fact]
    public void What_the_reader_accepts_with_a_trailing_comma_or_a_comment_is_logged_and_keeps_the_distrust_mark()
    {
        // A fuzz finding: the reader allows both, the check for a missing "suspect" read the same text strictly and threw.
        var id = OpenTrip();
        var intake = new EvidenceIntake(_test.Log);
        _test.Log.Append(id, new IndicationEntered(new Indication(new IndicatorId("FPI-A1-14"), IndicatorState.Fault, IndicationSource.Remote, Distrusted: true)), Samples.Operator);

        var result = intake.AddIndications(id, _grid, "{\n  \"indicator\": \"FPI-A1-14\", // remote\n  \"state\": \"none\",\n  \"source\": \"remote\",\n}", Samples.Operator);

        Assert.Equal(1, result.Accepted);
        var now = _test.Log.State(id).Incident.IndicationOf(new IndicatorId("FPI-A1-14"))!;
        Assert.Equal((IndicatorState.None, true), (now.State, now.Distrusted));
    }

    [Theory]
    [InlineData("""[ { "indicator": "FPI-A1-01", "state": "forward", "source": "remote" }, { "indicator": "FPI-A1-04", "state": "sideways", "source": "remote" } ]""")]
    [InlineData("""[ { "indicator": "FPI-A1-99", "state": "fault", "source": "remote" }, 7, { "state": "fault" } ]""")]
    [InlineData("""[ { "indicator": "FPI-A1-01", "state": "fault", "source": "remote", "readAt": "soon" } ]""")]
    public void Bad_indications_give_the_incident_readers_own_messages_and_nothing_is_logged(string items)
    {
        var id = OpenTrip();
        var file = $$"""{ "format": "{{IncidentFormat.FormatTag}}", "reportedAt": "2026-11-30T06:12:00Z", "faultType": "LG", "indications": {{items}} }""";

        var result = new EvidenceIntake(_test.Log).AddIndications(id, _grid, items, Samples.Operator);

        Assert.False(result.IsAccepted);
        Assert.Equal(IncidentReader.Parse(file, _grid).Errors, result.Issues.Where(i => i.Severity == Severity.Error));
        Assert.Single(_test.Log.Events(id));
    }

    [Theory]
    [InlineData("""{ "device": "CB-A1", "phaseCurrentA": -3 }""", "measurement", "#1", "phaseCurrentA")]
    [InlineData("""{ "indicator": "FPI-A1-\ud800", "state": "fault", "source": "remote" }""", "indications", "file", "")]
    [InlineData("""{ "device": "CB-A1", """, "measurements", "body", "")]
    [InlineData("""42""", "measurements", "body", "")]
    public void A_bad_body_names_the_element_and_field(string body, string kind, string element, string field)
    {
        var id = OpenTrip();
        var intake = new EvidenceIntake(_test.Log);

        var result = kind.StartsWith("indication", StringComparison.Ordinal)
            ? intake.AddIndications(id, _grid, body, Samples.Operator)
            : intake.AddMeasurements(id, _grid, body, Samples.Operator);

        var error = Assert.Single(result.Issues, i => i.Severity == Severity.Error);
        Assert.Equal((kind, element, field), (error.ElementKind, error.ElementId, error.Field));
        Assert.Single(_test.Log.Events(id));
    }

    [Fact]
    public void Evidence_naming_another_grid_is_refused_whole()
    {
        var id = OpenTrip();

        var result = new EvidenceIntake(_test.Log).AddIndications(id, _grid, """{ "indicator": "FPI-B1-404", "state": "fault", "source": "remote" }""", Samples.Operator);

        Assert.Equal(("indication", "FPI-B1-404", "indicator"), (result.Issues[0].ElementKind, result.Issues[0].ElementId, result.Issues[0].Field));
        Assert.Single(_test.Log.Events(id));
    }
}
