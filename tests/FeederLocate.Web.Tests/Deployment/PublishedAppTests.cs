using System.Diagnostics;
using System.Text.RegularExpressions;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Deployment;

/// <summary>
/// The published folder, copied alone into an empty folder and started from yet another folder, serves its
/// pages with every stylesheet and script they reference, and its sample grids.
/// </summary>
public sealed partial class PublishedAppTests(PublishedAppTests.Fixture published) : IClassFixture<PublishedAppTests.Fixture>
{
    private readonly PublishedApp _app = published.App;

    [Fact]
    public async Task The_copied_folder_serves_every_stylesheet_and_script_its_pages_reference()
    {
        using var http = new HttpClient { BaseAddress = _app.Address };

        var page = await http.GetStringAsync("/sign-in");
        var references = Reference().Matches(page).Select(m => m.Groups["path"].Value).Distinct().ToList();

        Assert.Contains(references, r => r.EndsWith(".css", StringComparison.Ordinal) && r.Contains("app", StringComparison.Ordinal));
        Assert.Contains(references, r => r.Contains("chart", StringComparison.Ordinal));
        Assert.Contains(references, r => r.Contains("blazor.web", StringComparison.Ordinal));
        // The History page's chart module is imported from script, not referenced in the markup.
        foreach (var path in references.Append("charts.js").Append("oneline.js"))
        {
            using var response = await http.GetAsync(path);
            Assert.True(response.IsSuccessStatusCode, $"{path}: {(int)response.StatusCode}");
            Assert.NotEmpty(await response.Content.ReadAsByteArrayAsync());
        }
    }

    [Fact]
    public void The_copied_folder_holds_the_sample_grids_and_keeps_its_database_where_the_settings_say()
    {
        Assert.NotEmpty(Directory.GetFiles(Path.Combine(_app.Folder, "sample-grid"), "*.grid.json"));
        Assert.True(File.Exists(Path.Combine(_app.Folder, "feederlocate.db")), "the database is created in the app's folder");
        Assert.Contains(_app.Output, l => l.Contains("admin", StringComparison.Ordinal));
    }

    [GeneratedRegex("(?:href|src)=\"(?<path>[^\"]+\\.(?:css|js))\"")]
    private static partial Regex Reference();

    /// <summary>Published once for the tests of this class.</summary>
    public sealed class Fixture : IAsyncLifetime
    {
        private readonly string _work = Directory.CreateTempSubdirectory("feederlocate-published-").FullName;

        public PublishedApp App { get; private set; } = default!;

        public async Task InitializeAsync() => App = await PublishedApp.Start(_work);

        public async Task DisposeAsync()
        {
            await App.DisposeAsync();
            Directory.Delete(_work, recursive: true);
        }
    }

    /// <summary><c>dotnet publish</c> into one folder, a copy of it alone elsewhere, started from a third folder on a free port.</summary>
    public sealed class PublishedApp : IAsyncDisposable
    {
        private readonly Process _process;

        private PublishedApp(Process process, string folder, Uri address, List<string> output)
        {
            _process = process;
            Folder = folder;
            Address = address;
            Output = output;
        }

        public string Folder { get; }

        public Uri Address { get; }

        public List<string> Output { get; }

        public static async Task<PublishedApp> Start(string work)
        {
            var published = Path.Combine(work, "published");
            await Run("dotnet", ["publish", Path.Combine(RepositoryFiles.Root, "src", "FeederLocate.Web"), "-c", "Release", "-o", published, "--nologo"]);
            var copy = Path.Combine(work, "copy", "feederlocate");
            CopyFolder(published, copy);
            Directory.Delete(published, recursive: true);
            var elsewhere = Directory.CreateDirectory(Path.Combine(work, "elsewhere")).FullName;

            var start = new ProcessStartInfo("dotnet", [Path.Combine(copy, "FeederLocate.Web.dll"), "--urls", "http://127.0.0.1:0"])
            {
                WorkingDirectory = elsewhere,
                RedirectStandardOutput = true,
                RedirectStandardError = true,
            };
            start.Environment["FEEDERLOCATE_ADMIN_PASSWORD"] = "published-app-password";
            var process = Process.Start(start)!;
            var output = new List<string>();
            var address = new TaskCompletionSource<Uri>();
            process.OutputDataReceived += (_, e) =>
            {
                if (e.Data is null)
                {
                    address.TrySetException(new InvalidOperationException($"the published app stopped: {string.Join(Environment.NewLine, output)}"));
                    return;
                }

                lock (output)
                {
                    output.Add(e.Data);
                }

                if (Running().Match(e.Data) is { Success: true } m)
                {
                    address.TrySetResult(new Uri(m.Groups["url"].Value));
                }
            };
            process.ErrorDataReceived += (_, e) =>
            {
                if (e.Data is not null)
                {
                    lock (output)
                    {
                        output.Add(e.Data);
                    }
                }
            };
            process.BeginOutputReadLine();
            process.BeginErrorReadLine();
            var started = await address.Task.WaitAsync(TimeSpan.FromMinutes(2));
            return new PublishedApp(process, copy, started, output);
        }

        private static async Task Run(string file, string[] args)
        {
            using var process = Process.Start(new ProcessStartInfo(file, args) { RedirectStandardOutput = true, RedirectStandardError = true })!;
            var output = process.StandardOutput.ReadToEndAsync();
            var error = process.StandardError.ReadToEndAsync();
            await process.WaitForExitAsync();
            if (process.ExitCode != 0)
            {
                throw new InvalidOperationException($"{file} {string.Join(' ', args)} failed: {await output}{await error}");
            }
        }

        private static void CopyFolder(string from, string to)
        {
            foreach (var file in Directory.EnumerateFiles(from, "*", SearchOption.AllDirectories))
            {
                var target = Path.Combine(to, Path.GetRelativePath(from, file));
                Directory.CreateDirectory(Path.GetDirectoryName(target)!);
                File.Copy(file, target);
            }
        }

        public async ValueTask DisposeAsync()
        {
            if (!_process.HasExited)
            {
                _process.Kill(entireProcessTree: true);
                await _process.WaitForExitAsync();
            }

            _process.Dispose();
        }
    }

    [GeneratedRegex(@"running at (?<url>http://[0-9.:]+)")]
    private static partial Regex Running();
}
