using CsCheck;
using FeederLocate.Core.Formats;
using FeederLocate.Web.Services;

namespace FeederLocate.Web.Tests.Hardening;

/// <summary>
/// Mutated grid files handed to the grid upload (the Grids page's <see cref="GridCatalog.Load"/>, replacement
/// confirmed): never an exception; a grid is stored whole (its graph and drawing built) or refused with errors and nothing is added.
/// </summary>
public sealed class GridUploadFuzzTests
{
    private const int Mutants = 120;

    [Fact]
    public void A_mutated_grid_upload_is_loaded_whole_or_refused_with_named_errors_and_nothing_added()
    {
        var bases = SampleGrids.Schemes.Select(s => File.ReadAllText(SampleGrids.TinyFenPath(s))).ToList();
        using var database = new TempDatabase();
        var catalog = Support.LoadedGrids.Catalog(Path.Combine(Path.GetTempPath(), "feederlocate-no-grids-" + Guid.NewGuid().ToString("N")), "none", database.Path);
        var engineer = new FeederLocate.Storage.Events.Actor("fuzz-engineer", "engineer");
        var (loaded, refused) = (0, 0);

        Mutations.MutantGen(bases.Count).Sample(
            mutant =>
            {
                var before = catalog.All.Count;
                var text = mutant.Apply(bases);
                var result = catalog.Load("upload.grid.json", text, engineer, replace: true, reason: "mutant");
                if (result.Outcome is Application.Grids.GridLoadOutcome.Stored or Application.Grids.GridLoadOutcome.Unchanged)
                {
                    var added = catalog.Find(result.GridName!);
                    Assert.NotNull(added);
                    Assert.Equal(GridReader.Parse(text).Value!.Segments.Length, added.Graph.Grid.Segments.Length);
                    loaded++;
                }
                else
                {
                    Assert.Contains(result.Issues, i => i.Severity == Severity.Error && i.ElementKind.Length > 0);
                    Assert.Equal(before, catalog.All.Count);
                    refused++;
                }
            },
            iter: Mutants,
            threads: 1,
            print: m => Mutations.Describe(m, bases));

        // The mutants reached both sides.
        Assert.True(loaded > 0 && refused > 0, $"loaded {loaded}, refused {refused}");
    }
}
