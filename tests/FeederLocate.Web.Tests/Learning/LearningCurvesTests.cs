using FeederLocate.Web.Services;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Learning;

/// <summary>The measured learning curves kept beside the sample grids, as the History page reads them.</summary>
public sealed class LearningCurvesTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("feederlocate-curves-").FullName;

    [Fact]
    public void Every_sample_grid_has_a_curve_from_no_history_to_two_hundred_outcomes()
    {
        var curves = new LearningCurves(Path.Combine(RepositoryFiles.Root, "sample-grid"));

        foreach (var grid in new[] { "solidly grounded", "resistor-grounded", "isolated neutral", "resonant, arc-suppression coil" })
        {
            var curve = curves.For($"Marrowdell 20 kV ({grid})");
            Assert.NotNull(curve);
            Assert.Equal([0, 10, 25, 40, 50, 100, 200], curve.Curve.Select(p => p.Outcomes));
            Assert.All(curve.Curve, p => Assert.InRange(p.SectionTop1, 0, 1));
            Assert.InRange(curve.TruthSectionTop1, 0, 1);
        }
    }

    [Fact]
    public void A_missing_or_damaged_file_gives_no_curve_and_no_error()
    {
        Assert.Null(new LearningCurves(_folder).For("any"));
        File.WriteAllText(Path.Combine(_folder, LearningCurves.FileName), "[{\"grid\": ");
        Assert.Null(new LearningCurves(_folder).For("any"));
    }

    public void Dispose() => Directory.Delete(_folder, recursive: true);
}
