using FeederLocate.Core.Formats;

namespace FeederLocate.Web.Api;

/// <summary>A 4xx answer: what is wrong, each problem with its element and field.</summary>
public sealed record ApiError(string Title, IReadOnlyList<ApiProblem> Problems)
{
    public static ApiError From(string title, IEnumerable<ValidationIssue> issues) =>
        new(title, [.. issues.Where(i => i.Severity == Severity.Error).Select(i => new ApiProblem(i.ElementKind, i.ElementId, i.Field, i.Message, i.ToString()))]);

    public static ApiError Single(string title, string elementKind, string elementId, string field, string message) =>
        new(title, [new ApiProblem(elementKind, elementId, field, message, $"{elementKind} {elementId}: {field} {message}".Trim())]);
}

public sealed record ApiProblem(string ElementKind, string ElementId, string Field, string Message, string Text);
