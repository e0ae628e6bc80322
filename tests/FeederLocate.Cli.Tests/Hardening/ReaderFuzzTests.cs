using CsCheck;
using FeederLocate.Core.Formats;
using Xunit.Abstractions;

namespace FeederLocate.Cli.Tests.Hardening;

/// <summary>
/// Thousands of mutants of the sample files through the readers: no mutant makes a reader throw, and each
/// is either accepted with no error (and then survives a write and read back unchanged) or rejected with
/// errors that each name the element at fault. CsCheck draws fresh seeds each run; a failure prints the
/// shrunk mutant (its edits and the changed text) and its seed, which replays it (CsCheck_Seed=...).
/// </summary>
public sealed class ReaderFuzzTests(ITestOutputHelper output)
{
    private const int MutantsPerReader = 3000;

    private static readonly string[] GridKinds = ["grid", "lineType", "substation", "node", "segment", "switch", "indicator", "crewBase"];

    private static readonly string[] IncidentKinds = ["incident", "measurement", "indication", "reclosing", "relay"];

    [Fact]
    public void Grid_reader_never_throws_and_accepts_a_mutant_cleanly_or_names_the_element_at_fault()
    {
        var bases = SampleFiles.Grids.Select(g => g.Text).ToList();
        var tally = new Tally();

        Mutations.MutantGen(bases.Count).Sample(
            mutant =>
            {
                var text = mutant.Apply(bases);
                var result = GridReader.Parse(text);
                AssertAcceptedCleanlyOrRejectedWithNamedErrors(result, GridKinds);
                if (result.Value is { } grid)
                {
                    var written = GridWriter.Write(grid);
                    var again = GridReader.Parse(written);
                    Assert.True(again.Succeeded, "the written grid reads back: " + string.Join("; ", again.Errors));
                    Assert.Equal(written, GridWriter.Write(again.Value!));
                }

                tally.Count(Classify(result));
            },
            iter: MutantsPerReader,
            print: m => Mutations.Describe(m, bases));

        output.WriteLine(tally.Summary);
        tally.AssertTheMutantsReachedEveryOutcome(MutantsPerReader);
    }

    [Fact]
    public void Incident_reader_never_throws_and_accepts_a_mutant_cleanly_or_names_the_element_at_fault()
    {
        var incidents = SampleFiles.Incidents;
        var bases = incidents.Select(i => i.Text).ToList();
        var tally = new Tally();

        Mutations.MutantGen(bases.Count).Sample(
            mutant =>
            {
                var text = mutant.Apply(bases);
                var grid = incidents[mutant.Base % incidents.Count].Grid.Grid;
                var result = IncidentReader.Parse(text, grid);
                AssertAcceptedCleanlyOrRejectedWithNamedErrors(result, IncidentKinds);
                if (result.Value is { } incident)
                {
                    var written = IncidentWriter.Write(incident);
                    var again = IncidentReader.Parse(written, grid);
                    Assert.True(again.Succeeded, "the written incident reads back: " + string.Join("; ", again.Errors));
                    Assert.Equal(written, IncidentWriter.Write(again.Value!));
                }

                // Without its grid the reader checks the file alone; it must hold up just the same, and
                // what the grid would catch (unknown references) can only add errors, never remove them.
                var alone = IncidentReader.Parse(text, null);
                AssertAcceptedCleanlyOrRejectedWithNamedErrors(alone, IncidentKinds);
                Assert.True(alone.Succeeded || !result.Succeeded, "accepted with its grid but rejected without: " + string.Join("; ", alone.Errors));

                tally.Count(Classify(result));
            },
            iter: MutantsPerReader,
            print: m => Mutations.Describe(m, bases));

        output.WriteLine(tally.Summary);
        tally.AssertTheMutantsReachedEveryOutcome(MutantsPerReader);
    }

    [Fact]
    public void Mutations_are_replayable_values()
    {
        // Shrinking and replaying a failure rely on a mutant giving the same text every time.
        var bases = SampleFiles.Grids.Select(g => g.Text).ToList();
        Mutations.MutantGen(bases.Count).Sample(
            m => Assert.Equal(m.Apply(bases), m.Apply(bases)),
            iter: 50);
    }

    internal static void AssertAcceptedCleanlyOrRejectedWithNamedErrors<T>(LoadResult<T> result, string[] kinds)
        where T : class
    {
        var errors = result.Errors.ToList();
        if (result.Value is not null)
        {
            Assert.Empty(errors);
            return;
        }

        Assert.NotEmpty(errors);
        foreach (var error in errors)
        {
            var text = error.ToString();
            Assert.Contains(error.ElementKind, kinds);
            Assert.StartsWith(error.ElementKind + " ", text, StringComparison.Ordinal);
            Assert.False(string.IsNullOrWhiteSpace(error.ElementId), $"error without an element id: {text}");
            Assert.False(string.IsNullOrWhiteSpace(error.Message), $"error without a message: {text}");
        }
    }

    internal static MutantFate Classify<T>(LoadResult<T> result)
        where T : class
    {
        if (result.Succeeded)
        {
            return MutantFate.Accepted;
        }

        return result.Errors.All(e => e.Message.StartsWith("is not valid JSON", StringComparison.Ordinal)
            || e.Message.StartsWith("must hold one JSON object", StringComparison.Ordinal))
            ? MutantFate.RejectedAsJson
            : MutantFate.RejectedByElementChecks;
    }

    internal enum MutantFate
    {
        Accepted,
        RejectedAsJson,
        RejectedByElementChecks,
    }

    /// <summary>Counts outcomes across CsCheck's threads, to show the mutants exercised every path.</summary>
    internal sealed class Tally
    {
        private readonly int[] _counts = new int[Enum.GetValues<MutantFate>().Length];

        public void Count(MutantFate outcome) => Interlocked.Increment(ref _counts[(int)outcome]);

        public int this[MutantFate outcome] => Volatile.Read(ref _counts[(int)outcome]);

        public string Summary => string.Join(", ", Enum.GetValues<MutantFate>().Select(o => $"{o} {this[o]}"));

        public void AssertTheMutantsReachedEveryOutcome(int total)
        {
            var summary = Summary;
            Assert.True(this[MutantFate.Accepted] >= total / 20, $"too few mutants were accepted to test the round trip: {summary}");
            Assert.True(this[MutantFate.RejectedAsJson] >= total / 20, $"too few mutants broke the JSON syntax: {summary}");
            Assert.True(this[MutantFate.RejectedByElementChecks] >= total / 5, $"too few mutants reached the element checks: {summary}");
        }
    }
}
