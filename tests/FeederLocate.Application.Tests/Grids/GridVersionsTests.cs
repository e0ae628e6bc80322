using FeederLocate.Application.Grids;
using FeederLocate.Core.Comparison;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Grids;

namespace FeederLocate.Application.Tests.Grids;

public sealed class GridVersionsTests : IDisposable
{
    private static readonly Actor Engineer = new("grid-engineer", "engineer");
    private static readonly Actor Operator = new("duty-operator", "operator");
    private readonly TempDatabase _database = new();
    private readonly GridVersions _grids;

    public GridVersionsTests() => _grids = new GridVersions(GridVersionStore.Open(_database.Path, TestClock.Manual()));

    public void Dispose()
    {
        _grids.Dispose();
        _database.Dispose();
    }

    [Fact]
    public void A_new_name_is_version_1_and_the_same_text_again_stores_nothing()
    {
        var first = _grids.Load(VersionTexts.Original, "brackenfold.grid.json", Engineer);
        var again = _grids.Load(VersionTexts.Original, "brackenfold.grid.json", Engineer);

        Assert.Equal(GridLoadOutcome.Stored, first.Outcome);
        Assert.Equal(1, first.Version!.Version);
        Assert.Equal(GridLoadOutcome.Unchanged, again.Outcome);
        Assert.Equal([1], _grids.Versions(TestGrids.BrackenfoldName).Select(v => v.Version));
    }

    [Fact]
    public void Replacing_a_stored_grid_needs_confirmation_and_a_reason_and_then_is_the_next_version()
    {
        _grids.Load(VersionTexts.Original, "brackenfold.grid.json", Engineer);

        var unconfirmed = _grids.Load(VersionTexts.S2Longer, "brackenfold.grid.json", Engineer);
        var noReason = _grids.Load(VersionTexts.S2Longer, "brackenfold.grid.json", Engineer, replace: true, reason: "  ");

        Assert.Equal(GridLoadOutcome.NeedsConfirmation, unconfirmed.Outcome);
        Assert.Contains("confirm the replacement", unconfirmed.Refusal, StringComparison.Ordinal);
        var change = Assert.Single(unconfirmed.Difference!.Elements);
        Assert.Equal(("segment", "S2", ElementChangeKind.Changed), (change.Kind, change.Id, change.Change));
        Assert.Equal(new FieldChange("lengthKm", "3", "3.4"), Assert.Single(change.Fields));
        Assert.Equal(GridLoadOutcome.NeedsConfirmation, noReason.Outcome);
        Assert.Contains("reason", noReason.Refusal, StringComparison.Ordinal);
        Assert.Single(_grids.Versions(TestGrids.BrackenfoldName));

        var confirmed = _grids.Load(VersionTexts.S2Longer, "brackenfold.grid.json", Engineer, replace: true, reason: "S2 re-measured after the cable repair");

        Assert.Equal(GridLoadOutcome.Stored, confirmed.Outcome);
        Assert.Equal(2, confirmed.Version!.Version);
        Assert.Equal("S2 re-measured after the cable repair", confirmed.Version.Reason);
        Assert.Equal(Engineer, confirmed.Version.LoadedBy);
        Assert.Equal(2, _grids.Latest(TestGrids.BrackenfoldName)!.Number);
        Assert.Equal(3.4, _grids.Latest(TestGrids.BrackenfoldName)!.Grid.Segment(new SegmentId("S2")).LengthKm);
        Assert.Equal(3, _grids.Find(TestGrids.BrackenfoldName, 1)!.Grid.Segment(new SegmentId("S2")).LengthKm);
    }

    [Fact]
    public void Only_an_engineer_loads_and_an_invalid_file_stores_nothing()
    {
        var byOperator = _grids.Load(VersionTexts.Original, null, Operator);
        var invalid = _grids.Load("{ \"format\": \"feederlocate-grid/1\" }", null, Engineer);

        Assert.Equal(GridLoadOutcome.Invalid, byOperator.Outcome);
        Assert.Equal("only an engineer loads grid files", byOperator.Refusal);
        Assert.Equal(GridLoadOutcome.Invalid, invalid.Outcome);
        Assert.NotEmpty(invalid.Issues);
        Assert.Empty(_grids.Names());
    }

    [Fact]
    public void A_start_up_file_is_version_1_once_never_reverts_a_replacement_and_a_changed_file_is_a_logged_version()
    {
        var first = _grids.LoadAtStartUp("brackenfold.grid.json", VersionTexts.Original);
        Assert.Equal((GridLoadOutcome.Stored, 1), (first.Outcome, first.Version!.Version));
        Assert.Equal(GridVersions.StartUp, first.Version.LoadedBy);

        _grids.Load(VersionTexts.S2Longer, "upload.json", Engineer, replace: true, reason: "re-measured");
        // The next start finds the file as it was: the engineer's version stays the latest.
        var unchanged = _grids.LoadAtStartUp("brackenfold.grid.json", VersionTexts.Original);
        Assert.Equal(GridLoadOutcome.Unchanged, unchanged.Outcome);
        Assert.Equal(2, _grids.Latest(TestGrids.BrackenfoldName)!.Number);

        var changed = _grids.LoadAtStartUp("brackenfold.grid.json", VersionTexts.WithoutFi3);
        Assert.Equal((GridLoadOutcome.Stored, 3), (changed.Outcome, changed.Version!.Version));
        Assert.Contains(GridContent.Sha256(VersionTexts.WithoutFi3), changed.Version.Reason, StringComparison.Ordinal);
        Assert.Equal(GridVersions.StartUp, changed.Version.LoadedBy);
    }

    [Fact]
    public void Two_versions_compare_by_element()
    {
        _grids.Load(VersionTexts.Original, null, Engineer);
        _grids.Load(VersionTexts.WithoutFi3, null, Engineer, replace: true, reason: "FI3 taken out");

        var difference = _grids.Compare(TestGrids.BrackenfoldName, 1, 2)!;

        var removed = Assert.Single(difference.Elements);
        Assert.Equal(("indicator", "FI3", ElementChangeKind.Removed), (removed.Kind, removed.Id, removed.Change));
        Assert.Null(_grids.Compare(TestGrids.BrackenfoldName, 1, 9));
    }
}
