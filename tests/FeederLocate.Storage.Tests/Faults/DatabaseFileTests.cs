using FeederLocate.Core.Model;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Maintenance;
using FeederLocate.Storage.Tests.Support;

namespace FeederLocate.Storage.Tests.Faults;

/// <summary>A deleted or replaced file stops writes; a damaged page is found; a second server is refused.</summary>
public class DatabaseFileTests
{
    private static readonly Actor Operator = new("duty-operator", "operator");

    [Fact]
    public void Once_the_file_is_deleted_every_write_is_refused_naming_the_file()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        using var accounts = AccountStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        foreach (var file in Directory.GetFiles(db.Folder))
        {
            File.Delete(file);
        }

        var error = Assert.Throws<DatabaseFileGoneException>(() => store.Append(id, new IncidentClosed(), Operator));
        Assert.Throws<DatabaseFileGoneException>(() => store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator));
        Assert.Throws<DatabaseFileGoneException>(() => accounts.RecordSuccessfulSignIn("nobody"));

        Assert.Contains(db.Path, error.Message, StringComparison.Ordinal);
        Assert.Contains("was deleted", error.Message, StringComparison.Ordinal);
        Assert.False(File.Exists(db.Path));
    }

    [Fact]
    public void A_file_renamed_over_the_database_is_not_written_to()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.BackupTo(db.Sibling("copy.db"));
        File.Move(db.Sibling("copy.db"), db.Path, overwrite: true);

        var error = Assert.Throws<DatabaseFileGoneException>(() => store.Append(id, new IncidentClosed(), Operator));

        Assert.Contains("replaced", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Reading_commands_on_a_missing_path_create_nothing()
    {
        using var db = new TempDatabase();

        var error = Assert.Throws<DatabaseMissingException>(() => IncidentStore.OpenExisting(db.Path));

        Assert.Contains(db.Path, error.Message, StringComparison.Ordinal);
        Assert.Empty(Directory.GetFiles(db.Folder));
    }

    [Fact]
    public void A_damaged_page_fails_the_quick_check()
    {
        using var db = new TempDatabase();
        using (var store = IncidentStore.Open(db.Path, TestClock.Manual()))
        {
            var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
            store.Append(id, [.. Enumerable.Range(1, 60).Select(i => (IncidentEvent)new PlanStepCompleted(i, "open " + new string('x', 500), "SW1"))], Operator);
        }

        var length = new FileInfo(db.Path).Length;
        using (var file = new FileStream(db.Path, FileMode.Open, FileAccess.Write))
        {
            // Overwrite the last page but one with garbage (pages are 4096 bytes by default).
            file.Position = length - (2 * 4096);
            file.Write(Enumerable.Repeat((byte)0xA5, 4096).ToArray());
        }

        using var damaged = IncidentStore.Open(db.Path, TestClock.Manual());
        var report = damaged.QuickCheck();

        Assert.False(report.IsOk);
        Assert.NotEmpty(report.Problems);
    }

    [Fact]
    public void A_second_server_on_the_same_database_is_refused_until_the_first_stops()
    {
        using var db = new TempDatabase();
        var first = InstanceLock.Claim(db.Path);

        var error = Assert.Throws<DatabaseInUseException>(() => InstanceLock.Claim(db.Path));
        first.Dispose();
        using var second = InstanceLock.Claim(db.Path);

        Assert.Contains("already served by another FeederLocate web app", error.Message, StringComparison.Ordinal);
        Assert.Equal(db.Path + ".lock", second.LockPath);
    }
}
