namespace FeederLocate.Core.Formats;

public enum Severity
{
    Error,
    Warning,
}

/// <summary>
/// One problem found in a grid or incident file: the element (kind and id), the field and what is wrong,
/// for example <c>segment S12: lengthKm must be &gt; 0, got -1</c>.
/// </summary>
public sealed record ValidationIssue(Severity Severity, string ElementKind, string ElementId, string Field, string Message)
{
    public override string ToString() =>
        Field.Length == 0
            ? $"{ElementKind} {ElementId}: {Message}".Trim()
            : $"{ElementKind} {ElementId}: {Field} {Message}".Replace("  ", " ", StringComparison.Ordinal);
}

/// <summary>Result of reading a file: the value when there is no error, and every issue found.</summary>
public sealed record LoadResult<T>(T? Value, IReadOnlyList<ValidationIssue> Issues)
    where T : class
{
    public bool Succeeded => Value is not null;

    public IEnumerable<ValidationIssue> Errors => Issues.Where(i => i.Severity == Severity.Error);

    public IEnumerable<ValidationIssue> Warnings => Issues.Where(i => i.Severity == Severity.Warning);

    /// <summary>The value, or a <see cref="GridDataException"/> listing every error.</summary>
    public T ValueOrThrow() => Value ?? throw new GridDataException(Errors.ToList());
}

/// <summary>Bad grid or incident data, with every error found.</summary>
public sealed class GridDataException(IReadOnlyList<ValidationIssue> errors)
    : Exception(string.Join(Environment.NewLine, errors))
{
    public IReadOnlyList<ValidationIssue> Errors { get; } = errors;
}
