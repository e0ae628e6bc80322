using FeederLocate.Core.Comparison;
using FeederLocate.Core.Formats;
using FeederLocate.Storage.Grids;

namespace FeederLocate.Application.Grids;

/// <summary>What came of loading a grid's text.</summary>
public enum GridLoadOutcome
{
    /// <summary>The text is not a valid grid: nothing stored (see the issues).</summary>
    Invalid,

    /// <summary>Stored as a new version (version 1 for a new name).</summary>
    Stored,

    /// <summary>The same text as the latest version of its name: nothing stored.</summary>
    Unchanged,

    /// <summary>
    /// A grid of this name is stored with other content: nothing stored until the loader confirms the
    /// replacement and gives a reason (see <see cref="GridLoad.Difference"/> against the latest version).
    /// </summary>
    NeedsConfirmation,
}

/// <summary>
/// The result of a load: the outcome, every issue found in the text, the version stored or matched, and for a
/// replacement the differences from the latest version. <see cref="Refusal"/> says in words why nothing was stored.
/// </summary>
public sealed record GridLoad(
    GridLoadOutcome Outcome,
    IReadOnlyList<ValidationIssue> Issues,
    string? GridName = null,
    GridVersion? Version = null,
    GridVersion? Latest = null,
    GridDifference? Difference = null,
    string? Refusal = null);
