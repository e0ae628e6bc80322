using FeederLocate.Cli.Input;

namespace FeederLocate.Cli.Tests.Faults;

/// <summary>Wrong paths, endless inputs, huge requests and special files: a clear message, exit 2, nothing made.</summary>
public sealed class CommandLineFaultTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("feederlocate-cli-faults-").FullName;

    private string InFolder(string name) => Path.Combine(_folder, name);

    [Theory]
    [InlineData("integrity")]
    [InlineData("history")]
    [InlineData("backup")]
    [InlineData("export")]
    public void A_reading_command_on_a_mistyped_database_path_exits_2_and_creates_nothing(string command)
    {
        var db = InFolder("histroy.db");
        string[] args = command == "backup" ? [command, "--db", db, "--output", InFolder("copy.db")] : [command, "--db", db];

        var run = CliRun.Of(args);

        Assert.Equal(2, run.ExitCode);
        Assert.Contains($"there is no database at {db}", run.Error, StringComparison.Ordinal);
        Assert.Empty(Directory.GetFileSystemEntries(_folder));
    }

    [Fact]
    public void An_endless_input_stops_at_the_size_limit_with_a_message()
    {
        var run = CliRun.Of("check", "/dev/zero");

        Assert.Equal(2, run.ExitCode);
        Assert.Contains($"is larger than {InputLimits.MaxFileBytes / (1024 * 1024)} MB", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void A_file_that_is_not_utf8_is_refused_not_repaired()
    {
        var path = InFolder("latin1.grid.json");
        var text = File.ReadAllBytes(SampleGrids.Path("solid"));
        // 0xE9 alone (é in Latin-1) is not a UTF-8 sequence (RFC 3629).
        var bytes = text.Take(40).Concat(new byte[] { 0xE9 }).Concat(text.Skip(40)).ToArray();
        File.WriteAllBytes(path, bytes);

        var run = CliRun.Of("check", path);

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("is not valid UTF-8 (at byte", run.Error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("2000000000")]
    [InlineData("200001")]
    [InlineData("0")]
    public void Generate_refuses_a_size_beyond_its_bound_and_writes_nothing(string segments)
    {
        var run = CliRun.Of("generate", "--segments", segments, "--output", InFolder("big.grid.json"));

        Assert.Equal(2, run.ExitCode);
        Assert.Contains($"--segments must be between 1 and {InputLimits.MaxGeneratedSegments}", run.Error, StringComparison.Ordinal);
        Assert.Empty(Directory.GetFileSystemEntries(_folder));
    }

    [Fact]
    public void Writing_to_a_full_device_reports_it_and_leaves_the_device_in_place()
    {
        var db = InFolder("history.db");
        Assert.Equal(0, CliRun.Of("record", SampleGrids.Path("solid"), RepositoryFiles.Path("sample-grid", "incidents", "solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", db).ExitCode);

        var run = CliRun.Of("export", "--db", db, "--output", "/dev/full");

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("cannot write '/dev/full'", run.Error, StringComparison.Ordinal);
        Assert.True(FileKinds.IsSpecial("/dev/full"));
        Assert.Empty(Directory.GetFiles("/dev", "full.*.tmp"));
    }

    [Fact]
    public async Task Writing_to_a_pipe_writes_through_it_and_keeps_it_a_pipe()
    {
        var pipe = InFolder("pipe");
        using (var mkfifo = System.Diagnostics.Process.Start("mkfifo", pipe))
        {
            await mkfifo.WaitForExitAsync();
        }

        var reader = Task.Run(() => File.ReadAllTextAsync(pipe));
        var run = CliRun.Of("generate", "--segments", "20", "--output", pipe);

        Assert.Equal(0, run.ExitCode);
        Assert.Contains("\"segments\"", await reader, StringComparison.Ordinal);
        Assert.True(FileKinds.IsSpecial(pipe));
    }

    [Fact]
    public void Record_refuses_switch_states_that_close_a_loop_and_logs_nothing()
    {
        var db = InFolder("history.db");
        var incident = InFolder("loop.incident.json");
        // The sample incident with its tie NO-A1-B1 closed, and LB-A1-4 closed too: feeder A1's tail is fed from both ends.
        var text = File.ReadAllText(RepositoryFiles.Path("sample-grid", "incidents", "solid-ll-a1-tail-fed-from-b1.incident.json"));
        File.WriteAllText(incident, text.Replace("\"LB-A1-4\": \"open\"", "\"LB-A1-4\": \"closed\"", StringComparison.Ordinal)
            .Replace("\"../marrowdell-solid.grid.json\"", $"\"{SampleGrids.Path("solid")}\"", StringComparison.Ordinal));

        var rank = CliRun.Of("rank", SampleGrids.Path("solid"), incident);
        var record = CliRun.Of("record", SampleGrids.Path("solid"), incident, "--segment", "S109", "--db", db);

        Assert.NotEqual(0, rank.ExitCode);
        Assert.Equal(2, record.ExitCode);
        Assert.Contains("radial operation only", record.Error, StringComparison.Ordinal);
        using var store = Storage.IncidentStore.Open(db);
        Assert.Empty(store.Incidents());
    }

    public void Dispose() => Directory.Delete(_folder, recursive: true);
}
