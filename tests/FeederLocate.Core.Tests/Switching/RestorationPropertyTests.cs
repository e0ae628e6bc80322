using Xunit.Abstractions;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>
/// Restoration on generated grids of several shapes equals the exhaustive search over switch states
/// with the same section isolated, at the plan's own cold-load factor and limits.
/// </summary>
public class RestorationPropertyTests(ITestOutputHelper output)
{
    public static TheoryData<string> Shapes() => [.. GeneratedRestorationCases.Shapes.Keys];

    [Theory]
    [MemberData(nameof(Shapes))]
    public void Plans_restore_what_the_exhaustive_search_restores(string shape)
    {
        var cases = GeneratedRestorationCases.Of(shape).Where(c => !c.NormalBreaksLimits).ToList();
        var enumerated = cases.Where(c => c.Enumerated).ToList();

        // At least a few cases of each shape must be small enough to enumerate, and some must restore anyone, or the comparison says nothing.
        Assert.True(enumerated.Count >= 6, $"{shape}: only {enumerated.Count} enumerable cases");
        Assert.Contains(enumerated, c => c.Exhaustive > 0);
        Assert.All(cases, c => Assert.True(c.Problems.Count == 0, $"{c}: {string.Join("; ", c.Problems)}"));
        var short_ = enumerated.Where(c => c.Planned != c.Exhaustive).ToList();
        Assert.True(short_.Count == 0, string.Join(Environment.NewLine, short_));
    }

    [Fact]
    public void Aggregate_restoration_is_at_least_98_percent_of_the_exhaustive_best()
    {
        var enumerated = GeneratedRestorationCases.Results.Where(c => c.Enumerated).ToList();
        var planned = enumerated.Sum(c => (long)c.Planned);
        var best = enumerated.Sum(c => (long)c.Exhaustive);
        var share = best == 0 ? 1.0 : planned / (double)best;
        output.WriteLine($"{enumerated.Count} enumerated cases over {GeneratedRestorationCases.Shapes.Count} shapes: the plans restore {planned} customers, the exhaustive search {best} ({share:P2})");
        foreach (var shape in GeneratedRestorationCases.Shapes.Keys)
        {
            var of = enumerated.Where(c => c.Shape == shape).ToList();
            output.WriteLine($"  {shape}: {of.Count} cases, {of.Sum(c => c.Planned)} of {of.Sum(c => c.Exhaustive)}; not enumerated {GeneratedRestorationCases.Of(shape).Count(c => !c.Enumerated && !c.NormalBreaksLimits)}");
        }

        Assert.True(best > 0, "the exhaustive search restores nobody: the comparison is vacuous");
        Assert.True(share >= 0.98, $"restoration {share:P2} of the exhaustive best");
    }
}
