using System.Collections.Immutable;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Tests.Switching;

namespace FeederLocate.Core.Tests.Formats;

/// <summary>The grid's optional <c>crews</c>: read, checked with element and field, written back unchanged.</summary>
public class CrewFormatTests
{
    public static TheoryData<string, string, string, string> Broken => new()
    {
        // crews array, element id, field, the whole message as printed
        { """[ { "id": "DEPOT", "node": "N9", "count": 1 } ]""", "DEPOT", "node", "crewBase DEPOT: node refers to unknown node \"N9\"" },
        { """[ { "id": "DEPOT", "node": "N1", "count": 1, "travelMinutes": { "D7": 10 } } ]""", "DEPOT", "travelMinutes", "crewBase DEPOT: travelMinutes refers to unknown switch \"D7\"" },
        { """[ { "id": "DEPOT", "node": "N1", "count": 0 } ]""", "DEPOT", "count", "crewBase DEPOT: count must be >= 1 and <= 1000, got 0" },
        { """[ { "id": "DEPOT", "node": "N1", "count": 1.5 } ]""", "DEPOT", "count", "crewBase DEPOT: count must be a whole number of crews, got 1.5" },
        { """[ { "id": "DEPOT", "node": "N1" } ]""", "DEPOT", "count", "crewBase DEPOT: count is required" },
        { """[ { "id": "DEPOT", "node": "N1", "count": 1, "travelMinutes": { "D1": -5 } } ]""", "DEPOT", "D1", "crewBase DEPOT travelMinutes: D1 must be >= 0 and <= 525960, got -5" },
        {
            """[ { "id": "DEPOT", "node": "N1", "count": 1 }, { "id": "DEPOT", "node": "N3", "count": 2 } ]""", "DEPOT", "id",
            "crewBase DEPOT: id is used by 2 crewBase elements; ids must be unique"
        },
    };

    [Theory]
    [MemberData(nameof(Broken))]
    public void Load_rejects_bad_crews_naming_element_and_field(string crews, string id, string field, string message)
    {
        var result = GridReader.Parse(CrewScheduleTests.FeederText(crews));

        Assert.False(result.Succeeded);
        Assert.Null(result.Value);
        var error = Assert.Single(result.Errors);
        Assert.Equal(id, error.ElementId.Split(' ')[0]);
        Assert.Equal(field, error.Field);
        Assert.Equal(message, error.ToString());
    }

    [Fact]
    public void A_travel_time_to_a_remote_device_is_a_warning()
    {
        var result = GridReader.Parse(CrewScheduleTests.FeederText("""[ { "id": "DEPOT", "node": "N1", "count": 1, "travelMinutes": { "CB": 10 } } ]"""));

        Assert.True(result.Succeeded);
        var warning = Assert.Single(result.Warnings);
        Assert.Equal("crewBase DEPOT: travelMinutes gives a time to CB, which is remote: no crew is sent to it", warning.ToString());
    }

    [Fact]
    public void Crews_are_read_with_their_base_count_and_times()
    {
        var grid = CrewScheduleTests.Feeder("""[ { "id": "DEPOT", "name": "East yard", "node": "N1", "count": 2, "travelMinutes": { "D2": 30 } }, { "id": "WEST", "node": "N5", "count": 1 } ]""");

        Assert.Equal(["DEPOT", "WEST"], grid.CrewBases.Select(b => b.Id.Value));
        var depot = grid.CrewBases[0];
        Assert.Equal((new NodeId("N1"), 2, "East yard"), (depot.Node, depot.Count, depot.Name));
        Assert.Equal(TimeSpan.FromMinutes(30), depot.TravelTo(new SwitchId("D2")));
        Assert.Null(depot.TravelTo(new SwitchId("D1")));
        Assert.Equal(["DEPOT/1", "DEPOT/2"], depot.CrewLabels);
        Assert.Null(grid.CrewBases[1].TravelTimes);
    }

    [Fact]
    public void A_grid_without_crews_reads_and_writes_without_them()
    {
        var text = GridWriter.Write(CrewScheduleTests.Feeder(null));

        Assert.DoesNotContain("crews", text, StringComparison.Ordinal);
        Assert.True(GridReader.Parse(text).Value!.CrewBases.IsEmpty);
    }

    [Fact]
    public void Written_crews_read_back_equal()
    {
        var grid = CrewScheduleTests.Feeder("""[ { "id": "DEPOT", "name": "East yard", "node": "N1", "count": 2, "travelMinutes": { "D2": 30, "D1": 12.5 } }, { "id": "WEST", "node": "N5", "count": 1 } ]""");

        var text = GridWriter.Write(grid);
        var read = GridReader.Parse(text);

        Assert.True(read.Succeeded, string.Join("\n", read.Issues));
        Assert.Empty(read.Warnings);
        ModelAssert.Equal(grid, read.Value!);
        Assert.Equal(text, GridWriter.Write(read.Value!));
        Assert.Equal(TimeSpan.FromMinutes(12.5), read.Value!.CrewBases[0].TravelTo(new SwitchId("D1")));
    }

    [Fact]
    public void WithCrewBases_refuses_what_the_reader_reports()
    {
        var grid = CrewScheduleTests.Feeder(null);
        CrewBase Base(string node = "N1", int count = 1, string device = "D1", double minutes = 10) =>
            new(new CrewBaseId("DEPOT"), new NodeId(node), count, null, ImmutableDictionary<SwitchId, TimeSpan>.Empty.Add(new SwitchId(device), TimeSpan.FromMinutes(minutes)));

        Assert.Throws<ArgumentException>(() => grid.WithCrewBases([Base(node: "N9")]));
        Assert.Throws<ArgumentException>(() => grid.WithCrewBases([Base(count: 0)]));
        Assert.Throws<ArgumentException>(() => grid.WithCrewBases([Base(device: "D7")]));
        Assert.Throws<ArgumentException>(() => grid.WithCrewBases([Base(minutes: -1)]));
        Assert.Throws<ArgumentException>(() => grid.WithCrewBases([Base(), Base()]));
        Assert.Single(grid.WithCrewBases([Base()]).CrewBases);
    }
}
