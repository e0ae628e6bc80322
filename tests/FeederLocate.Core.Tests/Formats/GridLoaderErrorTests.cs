using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.Support;

namespace FeederLocate.Core.Tests.Formats;

/// <summary>
/// The grid reader on the broken files in Formats/BrokenGrids (each a Tiny Fen grid with one problem,
/// or several where the file says so): no grid, and every error names the element, the field and the value.
/// </summary>
public class GridLoaderErrorTests
{
    public static TheoryData<string, string, string, string, string> SingleProblems => new()
    {
        // file, element kind, element id, field, the whole message as printed
        { "duplicate-segment-id", "segment", "S2", "id", "segment S2: id is used by 2 segment elements; ids must be unique" },
        { "segment-to-unknown-node", "segment", "S2", "to", "segment S2: to refers to unknown node \"N9\"" },
        { "segment-unknown-line-type", "segment", "S3", "lineType", "segment S3: lineType refers to unknown line type \"CAB-AL185\"" },
        { "indicator-on-unknown-segment", "indicator", "FI2", "segment", "indicator FI2: segment refers to unknown segment \"S7\"" },
        { "switch-to-unknown-node", "switch", "LB2", "to", "switch LB2: to refers to unknown node \"N8\"" },
        { "substation-unknown-bus", "substation", "FEN", "busNode", "substation FEN: busNode refers to unknown node \"FEN-MV\"" },
        { "negative-length", "segment", "S2", "lengthKm", "segment S2: lengthKm must be > 0, got -1" },
        { "zero-length", "segment", "S1", "lengthKm", "segment S1: lengthKm must be > 0, got 0" },
        { "negative-capacitance", "lineType", "CAB-AL150", "c0NfPerKm", "lineType CAB-AL150: c0NfPerKm must be >= 0, got -250" },
        {
            "unknown-scheme", "substation", "FEN grounding", "scheme",
            "substation FEN grounding: scheme must be one of \"isolated\", \"resonant\", \"solid\", \"impedance\", got \"earthed\""
        },
        {
            "resonant-without-detuning", "substation", "FEN grounding", "detuningPercent",
            "substation FEN grounding: detuningPercent is required for the resonant scheme (coil tuning)"
        },
        {
            "impedance-without-resistor", "substation", "FEN grounding", "neutralResistanceOhm",
            "substation FEN grounding: neutralResistanceOhm is required for the impedance scheme (neutral resistor)"
        },
        {
            "solid-without-transformer-z0", "substation", "FEN", "transformerZ0Ohm",
            "substation FEN: transformerZ0Ohm is required for the solid scheme (zero-sequence path through the transformer)"
        },
        {
            "indicator-node-not-an-end", "indicator", "FI2", "node",
            "indicator FI2: node \"N2\" is not an end of segment S2 (its ends are N3 and N4)"
        },
        {
            "wrong-format-tag", "grid", "file", "format",
            "grid file: format must be \"feederlocate-grid/1\", got \"feederlocate-grid/2\""
        },
        {
            "two-substations-joined", "substation", "MOOR", "busNode",
            "substation MOOR: busNode is connected to the bus of substation FEN in the normal state; each node must be fed from exactly one bus (open a tie between them)"
        },
    };

    [Theory]
    [MemberData(nameof(SingleProblems))]
    public void Load_rejects_a_broken_grid_with_one_error_naming_element_and_field(string file, string kind, string id, string field, string message)
    {
        var result = Load(file);

        Assert.False(result.Succeeded);
        Assert.Null(result.Value);
        var error = Assert.Single(result.Errors);
        Assert.Equal(kind, error.ElementKind);
        Assert.Equal(id, error.ElementId);
        Assert.Equal(field, error.Field);
        Assert.Equal(message, error.ToString());
        Assert.Throws<GridDataException>(() => result.ValueOrThrow());
    }

    [Fact]
    public void Load_reports_loop_with_its_elements()
    {
        var result = Load("closed-loop");

        Assert.False(result.Succeeded);
        Assert.Null(result.Value);
        var error = Assert.Single(result.Errors);
        Assert.Equal("switch", error.ElementKind);
        Assert.Equal("LB9", error.ElementId);

        // LB9 (N4–N5) closes N2 –S3– N5 –LB9– N4 –S2– N3 –LB2– N2; CB1 and S1 are not on it.
        var loop = error.Message[(error.Message.IndexOf("the loop is: ", StringComparison.Ordinal) + "the loop is: ".Length)..]
            .Split(", ");
        Assert.Equal(["segment S2", "segment S3", "switch LB2", "switch LB9"], loop.Order(StringComparer.Ordinal));
        Assert.StartsWith("switch LB9: closes a loop in the normal state", error.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void Load_reports_invalid_json_with_its_line()
    {
        var result = Load("invalid-json");

        Assert.False(result.Succeeded);
        Assert.Null(result.Value);
        var error = Assert.Single(result.Errors);

        // The comma after "frequencyHz": 50 on line 4 is missing; the parser stops on line 5.
        Assert.StartsWith("grid file: is not valid JSON at line 5, position ", error.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void Load_reports_a_string_where_a_number_or_a_boolean_goes()
    {
        var result = Load("string-for-number");

        Assert.False(result.Succeeded);
        Assert.Null(result.Value);
        Assert.Equal(
            [
                "segment S2: lengthKm must be a number, got \"6.0\"",
                "indicator FI1: directional must be true or false, got \"no\"",
            ],
            result.Errors.Select(e => e.ToString()));
    }

    [Fact]
    public void Load_reports_every_error_of_a_file_at_once()
    {
        var result = Load("several-errors");

        Assert.False(result.Succeeded);
        Assert.Null(result.Value);
        Assert.Equal(
            [
                "indicator FI3: segment refers to unknown segment \"S8\"",
                "lineType OHL-AL95: x1OhmPerKm must be a number, got \"0.35\"",
                "segment S1: lengthKm must be > 0, got -3",
                "segment S3: to refers to unknown node \"N9\"",
            ],
            result.Errors.Select(e => e.ToString()).Order(StringComparer.Ordinal));
    }

    [Fact]
    public void Load_warns_about_an_unknown_field_and_still_loads()
    {
        var result = Load("unknown-field");

        Assert.True(result.Succeeded, string.Join("\n", result.Issues));
        Assert.Empty(result.Errors);
        var warning = Assert.Single(result.Warnings);
        Assert.Equal("segment S2: colour is not a known field and was ignored", warning.ToString());
        Assert.Equal(6.0, result.Value!.Segment(new SegmentId("S2")).LengthKm);
    }

    [Fact]
    public void Every_broken_grid_file_is_used_by_a_test()
    {
        var files = Directory.GetFiles(RepositoryFiles.Path("tests", "FeederLocate.Core.Tests", "Formats", "BrokenGrids"), "*.grid.json")
            .Select(f => Path.GetFileName(f)[..^".grid.json".Length])
            .Order(StringComparer.Ordinal);
        var used = SingleProblems.Select(row => (string)row[0])
            .Concat(["closed-loop", "invalid-json", "string-for-number", "several-errors", "unknown-field"])
            .Order(StringComparer.Ordinal);

        Assert.Equal(used, files);
    }

    internal static LoadResult<Grid> Load(string name) =>
        GridReader.Parse(RepositoryFiles.Read("tests", "FeederLocate.Core.Tests", "Formats", "BrokenGrids", $"{name}.grid.json"));
}

public class DuplicateFieldTests
{
    [Fact]
    public void A_field_given_twice_is_an_error_naming_it_not_a_silent_choice()
    {
        var result = FeederLocate.Core.Formats.GridReader.Parse("""{ "format": "feederlocate-grid/1", "frequencyHz": 50, "frequencyHz": 60 }""");

        Assert.False(result.Succeeded);
        Assert.Contains(result.Errors, e => e.ToString().Contains("frequencyHz", StringComparison.Ordinal));
    }
}
