using System.Text;
using System.Text.Json;
using CsCheck;
using FeederLocate.Core.Formats;
using Xunit.Abstractions;

namespace FeederLocate.Cli.Tests.Hardening;

/// <summary>What may happen to a mutant's bytes on disk after its text is encoded.</summary>
public enum RawOp
{
    None,
    FlipByte,
    InsertByte,
    TruncateBytes,
    Utf8Bom,
    Utf16Bom,
    Utf32Bom,
}

/// <summary>A byte-level edit of the file as written; positions are taken modulo its length.</summary>
public readonly record struct RawEdit(RawOp Op, int Position, int Value)
{
    public static readonly Gen<RawEdit> Gen = CsCheck.Gen.Select(
        CsCheck.Gen.Frequency((3, CsCheck.Gen.Const(RawOp.None)), (2, CsCheck.Gen.Enum<RawOp>())),
        CsCheck.Gen.Int[0, 1_000_000],
        CsCheck.Gen.Int[0, 255],
        (op, position, value) => new RawEdit(op, position, value));

    public byte[] Apply(byte[] bytes)
    {
        if (bytes.Length == 0)
        {
            return bytes;
        }

        var at = Position % bytes.Length;
        return Op switch
        {
            RawOp.None => bytes,
            RawOp.FlipByte => [.. bytes[..at], (byte)(bytes[at] ^ (1 << (Value % 8))), .. bytes[(at + 1)..]],
            RawOp.InsertByte => [.. bytes[..at], (byte)Value, .. bytes[at..]],
            RawOp.TruncateBytes => bytes[..at],
            RawOp.Utf8Bom => [0xEF, 0xBB, 0xBF, .. bytes],
            RawOp.Utf16Bom => [0xFF, 0xFE, .. bytes],
            RawOp.Utf32Bom => [0xFF, 0xFE, 0x00, 0x00, .. bytes],
            _ => throw new InvalidOperationException($"unknown raw edit {Op}"),
        };
    }

    public override string ToString() => $"{Op}(at {Position}, value {Value})";
}

/// <summary>
/// Mutated grid and incident files through the command line, in-process: every run exits 0 or 2 (never 1,
/// the internal failure), an exit 2 carries at least one "error:" line on stderr, <c>check --json</c> still
/// prints one JSON document, and no run writes: each mutant's folder holds the same files with the same
/// bytes after every command. A failure prints the shrunk mutant and the seed that replays it.
/// </summary>
public sealed class CliFuzzTests(ITestOutputHelper output) : IDisposable
{
    private const int GridMutants = 300;

    private const int IncidentMutants = 300;

    private const string GridFile = "mutant.grid.json";

    private const string IncidentFile = "mutant.incident.json";

    private readonly string _root = Path.Combine(Path.GetTempPath(), $"feederlocate-cli-fuzz-{Guid.NewGuid():N}");

    public void Dispose()
    {
        if (Directory.Exists(_root))
        {
            Directory.Delete(_root, recursive: true);
        }
    }

    [Fact]
    public void Mutated_grids_through_check_fault_and_rank_exit_0_or_2_and_write_nothing()
    {
        var samples = SampleFiles.Grids;
        var bases = samples.Select(g => g.Text).ToList();
        var tally = new ReaderFuzzTests.Tally();

        FileGen(bases.Count).Sample(
            (mutant, raw) =>
            {
                var sample = samples[mutant.Base % samples.Count];
                using var folder = new FuzzFolder(_root);
                var gridPath = folder.Write(GridFile, raw.Apply(Encoding.UTF8.GetBytes(mutant.Apply(bases))));
                var incidentPath = folder.Write(IncidentFile, File.ReadAllBytes(SampleFiles.IncidentOn(sample).Path));

                // The command line refuses bytes that are not UTF-8 (RFC 3629) and reads the rest; judge the reader on the same text.
                var text = StrictUtf8(gridPath);
                var read = text is null ? null : GridReader.Parse(text);
                var valid = read?.Succeeded ?? false;
                if (read is not null)
                {
                    tally.Count(ReaderFuzzTests.Classify(read));
                }

                var check = folder.Run("check", gridPath, "--json");
                AssertExitContract(check);
                Assert.Equal(valid ? 0 : 2, check.ExitCode);
                if (text is null)
                {
                    Assert.Contains("is not valid UTF-8", check.Error, StringComparison.Ordinal);
                    Assert.Equal(string.Empty, check.Out);
                }
                else
                {
                    // One document and nothing else: JsonDocument rejects anything after the first value.
                    using var document = JsonDocument.Parse(check.Out);
                    Assert.Equal(valid, document.RootElement.GetProperty("valid").GetBoolean());
                    Assert.Equal(valid, document.RootElement.GetProperty("errors").GetArrayLength() == 0);
                }

                var fault = folder.Run("fault", gridPath, "--segment", "S101", "--type", "LG");
                AssertExitContract(fault);
                AssertSilentOnFailure(fault);
                Assert.True(valid || fault.ExitCode == 2, "fault accepted a grid the reader rejects");

                var rank = folder.Run("rank", gridPath, incidentPath);
                AssertExitContract(rank);
                AssertSilentOnFailure(rank);
                Assert.True(valid || rank.ExitCode == 2, "rank accepted a grid the reader rejects");
            },
            iter: GridMutants,
            print: t => Describe(t, bases));

        output.WriteLine(tally.Summary);
        Assert.True(tally[ReaderFuzzTests.MutantFate.Accepted] >= GridMutants / 20, $"too few valid mutants to run fault and rank on: {tally.Summary}");
    }

    [Fact]
    public void Mutated_incidents_through_rank_exit_0_or_2_and_write_nothing()
    {
        var samples = SampleFiles.Incidents;
        var bases = samples.Select(i => i.Text).ToList();
        var tally = new ReaderFuzzTests.Tally();

        FileGen(bases.Count).Sample(
            (mutant, raw) =>
            {
                var sample = samples[mutant.Base % samples.Count];
                using var folder = new FuzzFolder(_root);
                var gridPath = folder.Write(GridFile, File.ReadAllBytes(sample.Grid.Path));
                var incidentPath = folder.Write(IncidentFile, raw.Apply(Encoding.UTF8.GetBytes(mutant.Apply(bases))));
                var text = StrictUtf8(incidentPath);
                var read = text is null ? null : IncidentReader.Parse(text, sample.Grid.Grid);
                var valid = read?.Succeeded ?? false;
                if (read is not null)
                {
                    tally.Count(ReaderFuzzTests.Classify(read));
                }

                var rank = folder.Run("rank", gridPath, incidentPath);
                AssertExitContract(rank);
                AssertSilentOnFailure(rank);
                Assert.True(valid || rank.ExitCode == 2, "rank accepted an incident the reader rejects");

                var json = folder.Run("rank", gridPath, incidentPath, "--json");
                AssertExitContract(json);
                AssertSilentOnFailure(json);
                Assert.Equal(rank.ExitCode, json.ExitCode);
                if (json.ExitCode == 0)
                {
                    FuzzFindingTests.AssertProbabilitiesSumToOne(json.Json());
                }
            },
            iter: IncidentMutants,
            print: t => Describe(t, bases));

        output.WriteLine(tally.Summary);
        Assert.True(tally[ReaderFuzzTests.MutantFate.Accepted] >= IncidentMutants / 20, $"too few valid mutants to rank: {tally.Summary}");
    }

    /// <summary>
    /// Two in three files are any mutant, perhaps damaged on disk as well; one in three only has odd numbers
    /// put in, so enough files pass the reader to take fault and rank into the calculations.
    /// </summary>
    private static Gen<(Mutant, RawEdit)> FileGen(int baseCount) => Gen.Frequency(
        (2, Gen.Select(Mutations.MutantGen(baseCount), RawEdit.Gen)),
        (1, Mutations.NumberMutantGen(baseCount).Select(m => (m, new RawEdit(RawOp.None, 0, 0)))));

    private static string Describe((Mutant Mutant, RawEdit Raw) file, IReadOnlyList<string> bases) =>
        $"{Mutations.Describe(file.Mutant, bases)}; on disk {file.Raw}";

    /// <summary>The file's text, or null when its bytes are not UTF-8: what the command line reads or refuses.</summary>
    private static string? StrictUtf8(string path)
    {
        var bytes = File.ReadAllBytes(path);
        var start = bytes.AsSpan().StartsWith(Encoding.UTF8.Preamble) ? Encoding.UTF8.Preamble.Length : 0;
        try
        {
            return new UTF8Encoding(false, throwOnInvalidBytes: true).GetString(bytes, start, bytes.Length - start);
        }
        catch (DecoderFallbackException)
        {
            return null;
        }
    }

    private static void AssertExitContract(CliRun run)
    {
        Assert.True(run.ExitCode is 0 or 2, $"exit {run.ExitCode}, stderr: {run.Error}");
        if (run.ExitCode == 2)
        {
            Assert.Contains(run.Error.Split('\n'), line => line.StartsWith("error:", StringComparison.Ordinal));
        }
    }

    /// <summary>A command that fails prints its errors on stderr and nothing on stdout (check --json aside).</summary>
    private static void AssertSilentOnFailure(CliRun run)
    {
        if (run.ExitCode == 2)
        {
            Assert.Equal(string.Empty, run.Out);
        }
    }

    /// <summary>A fresh folder for one mutant; every command run in it must leave its files as they were.</summary>
    private sealed class FuzzFolder : IDisposable
    {
        private readonly string _path;

        public FuzzFolder(string root)
        {
            _path = Path.Combine(root, Guid.NewGuid().ToString("N"));
            Directory.CreateDirectory(_path);
        }

        public string Write(string name, byte[] bytes)
        {
            var path = Path.Combine(_path, name);
            File.WriteAllBytes(path, bytes);
            return path;
        }

        public CliRun Run(params string[] args)
        {
            var before = Snapshot();
            var run = CliRun.Of(args);
            var after = Snapshot();
            Assert.Equal(before.Keys.Order(StringComparer.Ordinal), after.Keys.Order(StringComparer.Ordinal));
            foreach (var (name, bytes) in before)
            {
                Assert.True(bytes.AsSpan().SequenceEqual(after[name]), $"{string.Join(' ', args)} changed {name}");
            }

            return run;
        }

        public void Dispose() => Directory.Delete(_path, recursive: true);

        private Dictionary<string, byte[]> Snapshot() =>
            Directory.GetFileSystemEntries(_path, "*", SearchOption.AllDirectories)
                .ToDictionary(p => Path.GetRelativePath(_path, p), p => File.Exists(p) ? File.ReadAllBytes(p) : [], StringComparer.Ordinal);
    }
}
