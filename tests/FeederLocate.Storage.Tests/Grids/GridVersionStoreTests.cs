using FeederLocate.Storage.Events;
using FeederLocate.Storage.Grids;
using FeederLocate.Storage.Tests.Support;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Tests.Grids;

public class GridVersionStoreTests
{
    private static readonly Actor Engineer = new("grid-engineer", "engineer");
    private static readonly Actor StartUp = new("start-up", "system");

    [Fact]
    public void Versions_are_numbered_per_grid_name_with_text_hash_who_when_and_why()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = GridVersionStore.Open(db.Path, clock);

        var first = store.Append("North 20 kV", "{\"v\":1}", StartUp, source: "north.grid.json");
        clock.At(30);
        var other = store.Append("South 10 kV", "{\"s\":1}", Engineer);
        clock.At(60);
        var second = store.Append("North 20 kV", "{\"v\":2}", Engineer, "new recloser at N7");

        Assert.Equal((1, 1, 2), (first.Version, other.Version, second.Version));
        Assert.Equal(["North 20 kV", "South 10 kV"], store.GridNames());
        Assert.Equal([1, 2], store.Versions("North 20 kV").Select(v => v.Version));
        Assert.Equal(second, store.Latest("North 20 kV"));
        Assert.Equal(first, store.Find("North 20 kV", 1));
        Assert.Equal("{\"v\":1}", store.TextOf("North 20 kV", 1));
        Assert.Equal("{\"v\":2}", store.TextOf("North 20 kV", 2));
        Assert.Null(store.TextOf("North 20 kV", 3));
        Assert.Null(store.Find("West", 1));
        Assert.Empty(store.Versions("West"));
        Assert.Equal(TestClock.Start.AddMinutes(60), second.LoadedAt);
        Assert.Equal(Engineer, second.LoadedBy);
        Assert.Equal("new recloser at N7", second.Reason);
        Assert.Equal("north.grid.json", first.Source);
        Assert.Equal(GridContent.Sha256("{\"v\":1}"), first.ContentSha256);
        Assert.NotEqual(first.ContentSha256, second.ContentSha256);
    }

    [Fact]
    public void The_hash_is_sha_256_of_the_text()
    {
        // The SHA-256 of "abc" is the FIPS 180-2 test vector (FIPS PUB 180-2, appendix B.1).
        Assert.Equal("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad", GridContent.Sha256("abc"));
    }

    [Fact]
    public void Versions_survive_reopening_the_file()
    {
        using var db = new TempDatabase();
        using (var store = GridVersionStore.Open(db.Path))
        {
            store.Append("North 20 kV", "one", StartUp);
            store.Append("North 20 kV", "two", Engineer, "replaced");
        }

        using var reopened = GridVersionStore.Open(db.Path);
        Assert.Equal(2, reopened.Latest("North 20 kV")!.Version);
        Assert.Equal("two", reopened.TextOf("North 20 kV", 2));
    }

    [Fact]
    public void Stored_versions_are_never_updated_or_deleted()
    {
        using var db = new TempDatabase();
        using (var store = GridVersionStore.Open(db.Path))
        {
            store.Append("North 20 kV", "one", StartUp);
        }

        using var raw = RawDatabase.Open(db.Path);
        Assert.Throws<SqliteException>(() => RawDatabase.Execute(raw, "UPDATE grid_versions SET grid_text = 'other'"));
        Assert.Throws<SqliteException>(() => RawDatabase.Execute(raw, "DELETE FROM grid_versions"));
        Assert.Throws<SqliteException>(() => RawDatabase.Execute(raw,
            "INSERT INTO grid_versions (grid_name, version, content_sha256, grid_text, loaded_at, loaded_by) VALUES ('North 20 kV', 1, $sha, 'x', 'now', 'someone')",
            ("$sha", new string('0', 64))));
        Assert.Equal("one", RawDatabase.Scalar(raw, "SELECT grid_text FROM grid_versions"));
    }
}
