using System.Net;
using System.Text;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Maintenance;
using FeederLocate.Web.Services;
using FeederLocate.Web.Tests.Support;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.Extensions.DependencyInjection;

namespace FeederLocate.Web.Tests.Faults;

/// <summary>
/// The web app against a failing database: a damaged file or a second app is refused at start, a full disk or
/// a deleted file is answered "not saved", an unreadable event is quarantined and everything else served.
/// </summary>
public sealed class DatabaseFaultWebTests : IDisposable
{
    private static readonly Actor Operator = new("duty-operator", "operator");
    private readonly string _folder = Directory.CreateTempSubdirectory("feederlocate-web-faults-").FullName;

    private string Db => Path.Combine(_folder, "incidents.db");

    private string[] Args(string db) =>
    [
        $"--FeederLocate:DatabasePath={db}",
        $"--FeederLocate:GridFolder={Path.Combine(RepositoryFiles.Root, "sample-grid")}",
        $"--FeederLocate:AdministratorPassword={ApiFixture.AdministratorPassword}",
        "--urls=http://127.0.0.1:0",
    ];

    [Fact]
    public async Task A_second_app_on_the_same_database_is_refused_with_a_clear_message()
    {
        await using var first = FeederLocateWebApp.Build(Args(Db));

        var error = Assert.Throws<DatabaseInUseException>(() => FeederLocateWebApp.Build(Args(Db)));

        Assert.Contains("already served by another FeederLocate web app", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_database_with_a_damaged_page_is_refused_at_start()
    {
        using (var store = IncidentStore.Open(Db))
        {
            var id = store.OpenIncident("x", Sample.Incident(), Operator);
            store.Append(id, [.. Enumerable.Range(1, 60).Select(i => (IncidentEvent)new PlanStepCompleted(i, "open " + new string('x', 500), "SW1"))], Operator);
        }

        var length = new FileInfo(Db).Length;
        using (var file = new FileStream(Db, FileMode.Open, FileAccess.Write))
        {
            file.Position = length - (2 * 4096);
            file.Write(Enumerable.Repeat((byte)0xA5, 4096).ToArray());
        }

        var error = Assert.Throws<DatabaseDamagedException>(() => FeederLocateWebApp.Build(Args(Db)));

        Assert.Contains("is damaged", error.Message, StringComparison.Ordinal);
        Assert.Contains("Restore the latest backup", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Once_the_database_file_is_deleted_posts_answer_503_not_saved_and_reads_go_on()
    {
        using var app = new ApiFixture();
        var id = await Sample.Open(app);
        var folder = Path.GetDirectoryName(app.Factory.Services.GetRequiredService<IncidentBoard>().DatabasePath)!;
        foreach (var file in Directory.GetFiles(folder, "incidents.db*"))
        {
            File.Delete(file);
        }

        var post = await app.Client.PostAsync($"/api/incidents/{id}/indications", Sample.Indication());
        var list = await app.Client.GetAsync("/api/incidents");

        var text = await ApiProblemTests.AssertProblem(post, HttpStatusCode.ServiceUnavailable);
        Assert.Contains("nothing more is saved", text, StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.OK, list.StatusCode);
    }

    [Fact]
    public async Task On_a_full_disk_a_post_answers_507_not_saved_and_works_again_once_there_is_room()
    {
        using var disk = SmallDisk.TryMount();
        var db = disk?.Path("incidents.db") ?? Db;
        using var factory = new WebApplicationFactory<Program>().WithWebHostBuilder(b =>
        {
            b.UseSetting("FeederLocate:DatabasePath", db);
            b.UseSetting("FeederLocate:GridFolder", Path.Combine(RepositoryFiles.Root, "sample-grid"));
            b.UseSetting("FeederLocate:AdministratorPassword", ApiFixture.AdministratorPassword);
        });
        var accounts = factory.Services.GetRequiredService<Web.Security.AccountDirectory>();
        accounts.CreateWithPassword("telecontrol", "Telecontrol", Storage.Accounts.AccountRole.Operator, "telecontrol-password", null, new Actor("admin", "engineer"));
        using var client = factory.CreateClient();
        client.DefaultRequestHeaders.Authorization = new("Bearer", accounts.IssueToken("telecontrol", "gateway", new Actor("admin", "engineer")).Secret);
        var id = await Sample.Open(client);
        var board = factory.Services.GetRequiredService<IncidentBoard>();
        var eventsBefore = board.State(new Storage.Incidents.IncidentId(id)).EventCount;
        string? filler = null;
        if (disk is not null)
        {
            filler = disk.Fill();
        }
        else
        {
            // Where no small disk can be mounted: SQLite's page limit gives the same SQLITE_FULL.
            Sample.LimitPages(board, grow: false);
        }

        // Post until the first refusal: on the full small disk the first post; under the page limit, once the last page is full.
        var accepted = 0;
        HttpResponseMessage answer;
        while ((answer = await client.PostAsync($"/api/incidents/{id}/indications", Sample.Indication(accepted))).StatusCode == HttpStatusCode.Accepted && accepted < 500)
        {
            accepted++;
        }

        var eventsWhenFull = board.State(new Storage.Incidents.IncidentId(id)).EventCount;
        if (filler is not null)
        {
            File.Delete(filler);
        }
        else
        {
            Sample.LimitPages(board, grow: true);
        }

        var later = await client.PostAsync($"/api/incidents/{id}/indications", Sample.Indication(accepted));

        var text = await ApiProblemTests.AssertProblem(answer, HttpStatusCode.InsufficientStorage);
        Assert.Contains("nothing was saved", text, StringComparison.Ordinal);
        Assert.Equal(eventsBefore + accepted, eventsWhenFull);
        Assert.Equal(HttpStatusCode.Accepted, later.StatusCode);
        Assert.Equal(eventsWhenFull + 1, board.State(new Storage.Incidents.IncidentId(id)).EventCount);
    }

    [Fact]
    public async Task An_unreadable_event_is_quarantined_and_every_page_and_list_still_answers()
    {
        using var app = new ApiFixture();
        var id = await Sample.Open(app);
        var other = await Sample.Open(app);
        var path = app.Factory.Services.GetRequiredService<IncidentBoard>().DatabasePath;
        using (var raw = new Microsoft.Data.Sqlite.SqliteConnection($"Data Source={path};Pooling=False"))
        {
            raw.Open();
            using var command = raw.CreateCommand();
            command.CommandText = $"INSERT INTO events (incident_id, sequence, time, actor, kind, payload) VALUES ({id}, 2, '2026-11-30T06:20:00Z', 'x', 'indicationEntered', '[1,2]')";
            command.ExecuteNonQuery();
        }

        var engineer = await FormSignIn.SignedIn(app.Factory, "admin", ApiFixture.AdministratorPassword);
        var answers = new[]
        {
            await app.Client.GetAsync("/api/incidents"),
            await app.Client.GetAsync($"/api/incidents/{id}"),
            await app.Client.GetAsync($"/api/incidents/{other}/ranking"),
            await engineer.GetAsync("/"),
            await engineer.GetAsync("/history"),
            await engineer.GetAsync($"/incidents/{id}"),
        };
        var accountsPage = await engineer.GetStringAsync("/accounts");

        Assert.All(answers, a => Assert.Equal(HttpStatusCode.OK, a.StatusCode));
        Assert.Contains("is quarantined", accountsPage, StringComparison.Ordinal);
        Assert.Contains($"incident {id}", accountsPage, StringComparison.Ordinal);
    }

    public void Dispose()
    {
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        Directory.Delete(_folder, recursive: true);
    }

    private static class Sample
    {
        public static Core.Evidence.Incident Incident() => new(
            new DateTimeOffset(2026, 11, 30, 6, 12, 0, TimeSpan.Zero), null,
            System.Collections.Immutable.ImmutableDictionary<Core.Model.SwitchId, Core.Evidence.SwitchPosition>.Empty, null, null, [], []);

        public static StringContent Indication(int round = 0) =>
            new($$"""{ "indicator": "FPI-A1-04", "state": "{{(round % 2 == 0 ? "fault" : "unknown")}}", "source": "remote" }""", Encoding.UTF8, "application/json");

        public static Task<long> Open(ApiFixture app) => Open(app.Client);

        public static async Task<long> Open(HttpClient client)
        {
            var body = """{ "format": "feederlocate-incident/1", "reportedAt": "2026-11-30T06:12:00Z", "trippedDevice": "CB-A1", "faultType": "LG", "indications": [] }""";
            var answer = await client.PostAsync($"/api/incidents?grid={Uri.EscapeDataString(ApiFixture.SolidGrid)}", new StringContent(body, Encoding.UTF8, "application/json"));
            Assert.Equal(HttpStatusCode.Created, answer.StatusCode);
            using var created = System.Text.Json.JsonDocument.Parse(await answer.Content.ReadAsStringAsync());
            return created.RootElement.GetProperty("id").GetInt64();
        }

        public static void LimitPages(IncidentBoard board, bool grow)
        {
            var store = (IncidentStore)typeof(Application.Incidents.IncidentLog).GetField("_store", System.Reflection.BindingFlags.NonPublic | System.Reflection.BindingFlags.Instance)!.GetValue(board)!;
            using var command = store.Connection.CreateCommand();
            command.CommandText = "PRAGMA page_count";
            var pages = Convert.ToInt64(command.ExecuteScalar(), System.Globalization.CultureInfo.InvariantCulture);
            command.CommandText = $"PRAGMA max_page_count = {(grow ? 1073741823 : pages)}";
            command.ExecuteScalar();
        }
    }
}
