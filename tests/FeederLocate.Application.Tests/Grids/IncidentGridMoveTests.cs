using FeederLocate.Application.Grids;
using FeederLocate.Application.Incidents;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Grids;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Tests.Grids;

public sealed class IncidentGridMoveTests : IDisposable
{
    private static readonly Actor Engineer = new("grid-engineer", "engineer");
    private static readonly Actor Operator = new("duty-operator", "operator");
    private readonly TempDatabase _database = new();
    private readonly GridVersions _grids;
    private readonly IncidentLog _log;
    private readonly IncidentGridMove _move;

    public IncidentGridMoveTests()
    {
        _grids = new GridVersions(GridVersionStore.Open(_database.Path, TestClock.Manual()));
        _log = new IncidentLog(IncidentStore.Open(_database.Path, TestClock.Manual()), (name, version) => _grids.Find(name, version)?.Grid);
        _move = new IncidentGridMove(_log, _grids);
        _grids.Load(VersionTexts.Original, null, Engineer);
    }

    public void Dispose()
    {
        _log.Dispose();
        _grids.Dispose();
        _database.Dispose();
    }

    private IncidentId OpenOnVersion1() => _log.Open(_grids.Find(TestGrids.BrackenfoldName, 1)!.Grid, TestIncidents.EarthFault(), Operator, gridVersion: 1);

    [Fact]
    public void A_new_version_leaves_an_open_incident_on_its_version_and_its_changes_are_checked_against_that_version()
    {
        var id = OpenOnVersion1();
        _grids.Load(VersionTexts.WithoutFi3, null, Engineer, replace: true, reason: "FI3 taken out");

        // FI3 is on version 1, where the incident stays: a reading of it is accepted.
        _log.Append(id, new IndicationEntered(new Indication(new IndicatorId("FI3"), IndicatorState.None, IndicationSource.Field)), Operator);

        Assert.Equal(1, _log.State(id).GridVersion);
        Assert.Equal(2, _grids.Latest(TestGrids.BrackenfoldName)!.Number);
    }

    [Fact]
    public void A_move_needs_an_engineer_and_a_reason_and_is_logged_with_them()
    {
        var id = OpenOnVersion1();
        _grids.Load(VersionTexts.S2Longer, null, Engineer, replace: true, reason: "S2 re-measured");

        var byOperator = _move.Move(id, 2, "newer data", Operator);
        var noReason = _move.Move(id, 2, " ", Engineer);
        var same = _move.Move(id, 1, "again", Engineer);
        var missing = _move.Move(id, 7, "typo", Engineer);
        Assert.Equal("only an engineer moves an incident to another grid version", byOperator.Refusal);
        Assert.Equal("give the reason for moving the incident to another grid version", noReason.Refusal);
        Assert.Contains("already on version 1", same.Refusal, StringComparison.Ordinal);
        Assert.Contains("has no version 7", missing.Refusal, StringComparison.Ordinal);
        Assert.Single(_log.Events(id));

        var moved = _move.Move(id, 2, "S2 length corrected", Engineer);

        Assert.True(moved.IsLogged);
        var state = _log.State(id);
        Assert.Equal(2, state.GridVersion);
        var move = Assert.Single(state.GridMoves);
        Assert.Equal((1, 2, "S2 length corrected", Engineer), (move.FromVersion, move.ToVersion, move.Reason, move.Actor));
    }

    [Fact]
    public void A_move_onto_a_version_without_an_element_the_evidence_names_is_refused()
    {
        var id = OpenOnVersion1();
        _grids.Load(VersionTexts.WithoutFi1, null, Engineer, replace: true, reason: "FI1 taken out");

        var refused = _move.Move(id, 2, "newer data", Engineer);

        Assert.Contains("the version has no indicator FI1", refused.Refusal, StringComparison.Ordinal);
        Assert.Equal(1, _log.State(id).GridVersion);
    }

    [Fact]
    public void A_closed_incident_is_not_moved()
    {
        var id = OpenOnVersion1();
        _grids.Load(VersionTexts.S2Longer, null, Engineer, replace: true, reason: "S2 re-measured");
        _log.Append(id, new IncidentClosed(), Engineer);

        Assert.Contains("is closed", _move.Move(id, 2, "late", Engineer).Refusal, StringComparison.Ordinal);
    }
}
