using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.Support;

namespace FeederLocate.Core.Tests.Formats;

/// <summary>
/// The incident reader, checked against the Tiny Fen resonant grid, on the broken files in
/// Formats/BrokenIncidents (each the Tiny Fen incident with one problem).
/// </summary>
public class IncidentLoaderErrorTests
{
    public static TheoryData<string, string, string, string, string> SingleProblems => new()
    {
        // file, element kind, element id, field, the whole message as printed
        { "unknown-indicator", "indication", "FI7", "indicator", "indication FI7: indicator refers to unknown indicator \"FI7\"" },
        { "unknown-switch-in-switch-states", "incident", "file", "switchStates.LB7", "incident file: switchStates.LB7 refers to unknown switch" },
        {
            "tripped-load-break-switch", "incident", "file", "trippedDevice",
            "incident file: trippedDevice must be a breaker, recloser or fuse; LB2 is a loadBreakSwitch"
        },
        {
            "bad-state", "indication", "FI1", "state",
            "indication FI1: state must be one of \"fault\", \"none\", \"forward\", \"reverse\", \"unknown\", got \"tripped\""
        },
        {
            "forward-on-non-directional", "indication", "FI3", "state",
            "indication FI3: state \"forward\" needs a directional indicator; FI3 is non-directional"
        },
        {
            "fault-on-directional", "indication", "FI2", "state",
            "indication FI2: state \"fault\" is not a state of the directional indicator FI2: use forward or reverse"
        },
        {
            "bad-reported-time", "incident", "file", "reportedAt",
            "incident file: reportedAt must be an ISO 8601 date and time such as 2026-11-30T06:12:00Z, got \"14/03/2026 09:30\""
        },
        {
            "read-date-without-time", "indication", "FI3", "readAt",
            "indication FI3: readAt must be an ISO 8601 date and time such as 2026-11-30T06:12:00Z, got \"2026-03-14\""
        },
        { "bad-switch-position", "incident", "file", "switchStates.LB2", "incident file: switchStates.LB2 must be \"open\" or \"closed\", got \"shut\"" },
        {
            "unknown-fault-type", "incident", "file", "faultType",
            "incident file: faultType must be one of \"LG\", \"LL\", \"LLG\", \"LLL\", \"unknown\", got \"LLLG\""
        },
        {
            "indicator-listed-twice", "indication", "FI1", "indicator",
            "indication FI1: indicator is listed more than once; give one indication per indicator"
        },
        {
            "reclosing-at-load-break-switch", "reclosing", "file", "device",
            "reclosing file: device must be a breaker or recloser; LB2 is a loadBreakSwitch"
        },
        {
            "reclosing-attempts-out-of-range", "reclosing", "file", "attempts",
            "reclosing file: attempts must be a whole number from 0 to 4, got 5"
        },
        { "fuse-that-is-a-breaker", "incident", "file", "fuses.CB1", "incident file: fuses.CB1 must name a fuse; CB1 is a breaker" },
        { "fuse-unknown", "incident", "file", "fuses.FU9", "incident file: fuses.FU9 refers to unknown switch \"FU9\"" },
        {
            "relay-at-load-break-switch", "relay", "LB2", "device",
            "relay LB2: device must be a breaker or recloser; LB2 is a loadBreakSwitch"
        },
        {
            "relay-bad-direction", "relay", "CB1", "earthFaultDirection",
            "relay CB1: earthFaultDirection must be one of \"forward\", \"reverse\", \"none\", got \"backward\""
        },
        { "relay-negative-reactance", "relay", "CB1", "faultReactanceOhm", "relay CB1: faultReactanceOhm must be >= 0, got -1.5" },
        {
            "reading-before-fault-time", "indication", "FI3", "readAt",
            "indication FI3: readAt 2026-03-14T09:10:00Z is before faultAt 2026-03-14T09:20:00Z: a reading taken before the fault says nothing of it"
        },
        {
            "fault-after-report", "incident", "file", "faultAt",
            "incident file: faultAt 2026-03-14T09:40:00Z is later than reportedAt 2026-03-14T09:30:00Z: a fault is reported after it began"
        },
        {
            "year-one", "incident", "file", "reportedAt",
            "incident file: reportedAt must lie between 1950-01-01 and 2100-01-01, got \"0001-01-01T00:00:00Z\""
        },
        {
            "read-in-year-9999", "indication", "FI3", "readAt",
            "indication FI3: readAt must lie between 1950-01-01 and 2100-01-01, got \"9999-12-31T23:59:59Z\""
        },
        {
            "device-recorded-twice", "measurement", "#2", "device",
            "measurement #2: device is listed more than once; give one record per device"
        },
        {
            "wrong-format-tag", "incident", "file", "format",
            "incident file: format must be \"feederlocate-incident/1\", got \"feederlocate-grid/1\""
        },
    };

    [Fact]
    public void The_unbroken_incident_loads_against_its_grid()
    {
        var result = IncidentReader.Parse(
            RepositoryFiles.Read("tests", "FeederLocate.Core.Tests", "ReferenceCases", "TinyFen", "tiny-resonant-lg-s2.incident.json"),
            Grids.TinyFen("resonant"));

        Assert.True(result.Succeeded, string.Join("\n", result.Issues));
        Assert.Empty(result.Issues);
        var incident = result.Value!;
        Assert.Equal(FaultType.LG, incident.FaultType);
        Assert.Null(incident.TrippedDevice);
        Assert.Equal(IndicatorState.Fault, incident.IndicationOf(new IndicatorId("FI3"))!.State);
        Assert.Equal(IndicationSource.Field, incident.IndicationOf(new IndicatorId("FI3"))!.Source);
        Assert.Equal(new DateTimeOffset(2026, 3, 14, 10, 5, 0, TimeSpan.Zero), incident.IndicationOf(new IndicatorId("FI3"))!.ReadAt);
    }

    [Theory]
    [MemberData(nameof(SingleProblems))]
    public void Load_rejects_a_broken_incident_with_one_error_naming_element_and_field(string file, string kind, string id, string field, string message)
    {
        var result = IncidentReader.Parse(
            RepositoryFiles.Read("tests", "FeederLocate.Core.Tests", "Formats", "BrokenIncidents", $"{file}.incident.json"),
            Grids.TinyFen("resonant"));

        Assert.False(result.Succeeded);
        Assert.Null(result.Value);
        var error = Assert.Single(result.Errors);
        Assert.Equal(kind, error.ElementKind);
        Assert.Equal(id, error.ElementId);
        Assert.Equal(field, error.Field);
        Assert.Equal(message, error.ToString());
    }

    [Fact]
    public void More_substation_records_than_the_limit_are_refused_as_one_error()
    {
        var records = string.Join(",", Enumerable.Range(0, EvidenceLimits.MaxMeasurementsPerIncident + 1).Select(i => $$"""{ "device": "CB1", "residualCurrentA": {{i}} }"""));
        var text = $$"""{ "format": "feederlocate-incident/1", "reportedAt": "2026-03-14T09:30:00Z", "faultType": "LG", "measurements": [{{records}}], "indications": [] }""";

        var result = IncidentReader.Parse(text, Grids.TinyFen("resonant"));

        var error = Assert.Single(result.Errors);
        Assert.Equal($"incident file: measurements holds {EvidenceLimits.MaxMeasurementsPerIncident + 1} records; at most {EvidenceLimits.MaxMeasurementsPerIncident} are accepted", error.ToString());
    }

    [Fact]
    public void Every_broken_incident_file_is_used_by_a_test()
    {
        var files = Directory.GetFiles(RepositoryFiles.Path("tests", "FeederLocate.Core.Tests", "Formats", "BrokenIncidents"), "*.incident.json")
            .Select(f => Path.GetFileName(f)[..^".incident.json".Length])
            .Order(StringComparer.Ordinal);

        Assert.Equal(SingleProblems.Select(row => (string)row[0]).Order(StringComparer.Ordinal), files);
    }
}
