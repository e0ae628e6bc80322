using System.Globalization;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Storage.Tests.Support;

namespace FeederLocate.Storage.Tests.Concurrency;

/// <summary>
/// Other processes writing the same file: one killed mid-write, two writing at once. Each writer is the
/// FeederLocate.Storage.Tests.Writer program, appending indication events one transaction at a time.
/// </summary>
public class WriterProcessTests
{
    private const int IdsBeforeKill = 200;

    // Bounds a writer that is never killed: it stops by itself after this many events.
    private const int WriterLimit = 100_000;

    private const int EventsPerWriter = 150;

    // Guards against a hung child only; no test asserts on how long anything takes.
    private static readonly TimeSpan HangGuard = TimeSpan.FromMinutes(2);

    [Fact]
    public async Task A_writer_killed_mid_write_loses_no_committed_event_and_leaves_a_sound_file()
    {
        using var db = new TempDatabase();
        var incident = OpenIncident(db.Path);
        using var cancel = new CancellationTokenSource(HangGuard);
        var printed = new List<long>();

        using (var writer = await WriterProcess.StartAsync(db.Path, incident, WriterLimit, "writer-a", cancel.Token))
        {
            try
            {
                writer.Go();
                while (printed.Count < IdsBeforeKill)
                {
                    var line = await writer.ReadLineAsync(cancel.Token)
                        ?? throw new InvalidOperationException($"the writer ended after {printed.Count} events: {writer.Errors}");
                    printed.Add(long.Parse(line, CultureInfo.InvariantCulture));
                }
            }
            finally
            {
                writer.Kill();
            }
        }

        using var store = IncidentStore.Open(db.Path);
        var events = store.Events(incident);
        Assert.Subset(events.Select(e => e.Id.Value).ToHashSet(), printed.ToHashSet());
        // Nothing half-written either: the sequence runs 1, 2, … without a gap, and every event reads back.
        Assert.Equal(Enumerable.Range(1, events.Count), events.Select(e => e.Sequence));
        Assert.All(events.Skip(1), e => Assert.IsType<IndicationEntered>(e.Event));
        var report = store.CheckIntegrity();
        Assert.True(report.IsOk, report.ToString());
    }

    [Fact]
    public async Task Two_writer_processes_at_once_lose_and_repeat_nothing()
    {
        using var db = new TempDatabase();
        var incident = OpenIncident(db.Path);
        using var cancel = new CancellationTokenSource(HangGuard);

        using var a = await WriterProcess.StartAsync(db.Path, incident, EventsPerWriter, "writer-a", cancel.Token);
        using var b = await WriterProcess.StartAsync(db.Path, incident, EventsPerWriter, "writer-b", cancel.Token);
        // Both have the store open before either writes.
        a.Go();
        b.Go();
        var printed = await Task.WhenAll(a.ReadToEndAsync(cancel.Token), b.ReadToEndAsync(cancel.Token));

        Assert.True(a.ExitCode == 0, $"writer-a exited with {a.ExitCode}: {a.Errors}");
        Assert.True(b.ExitCode == 0, $"writer-b exited with {b.ExitCode}: {b.Errors}");
        Assert.Equal(string.Empty, a.Errors + b.Errors);
        Assert.Equal(EventsPerWriter, printed[0].Count);
        Assert.Equal(EventsPerWriter, printed[1].Count);
        using var store = IncidentStore.Open(db.Path);
        var events = store.Events(incident);
        // The opening event and every event of both writers, each once.
        Assert.Equal(1 + (2 * EventsPerWriter), events.Count);
        Assert.Equal(
            printed[0].Concat(printed[1]).Select(id => long.Parse(id, CultureInfo.InvariantCulture)).Order(),
            events.Skip(1).Select(e => e.Id.Value).Order());
        Assert.Equal(Enumerable.Range(1, events.Count), events.Select(e => e.Sequence));
        Assert.Equal(EventsPerWriter, events.Count(e => e.Actor.Name == "writer-a"));
        Assert.Equal(EventsPerWriter, events.Count(e => e.Actor.Name == "writer-b"));
        Assert.True(store.CheckIntegrity().IsOk, store.CheckIntegrity().ToString());
    }

    private static IncidentId OpenIncident(string path)
    {
        using var store = IncidentStore.Open(path);
        return store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), new Actor("test"));
    }
}
