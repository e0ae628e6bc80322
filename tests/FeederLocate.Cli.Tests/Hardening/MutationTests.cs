namespace FeederLocate.Cli.Tests.Hardening;

/// <summary>The mutator itself: every edit applies to any JSON, including what earlier edits left.</summary>
public sealed class MutationTests
{
    [Fact]
    public void Renaming_a_property_already_renamed_to_the_empty_name_applies()
    {
        // Choice 3 renames to "", choice 2 drops the last character: once threw on "" (found by the API fuzzing).
        var renamed = Mutations.ApplyTree("""{ "a": 1 }""", [new TreeEdit(TreeOp.RenameProperty, 0, 3), new TreeEdit(TreeOp.RenameProperty, 0, 2)]);

        Assert.Contains("\"X\"", renamed, StringComparison.Ordinal);
        Assert.DoesNotContain("\"a\"", renamed, StringComparison.Ordinal);
    }
}
