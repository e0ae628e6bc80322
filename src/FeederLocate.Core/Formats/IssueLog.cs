namespace FeederLocate.Core.Formats;

/// <summary>Collects issues while a file is read and checked.</summary>
internal sealed class IssueLog
{
    private readonly List<ValidationIssue> _issues = [];

    public IReadOnlyList<ValidationIssue> Issues => _issues;

    public bool HasErrors => _issues.Exists(i => i.Severity == Severity.Error);

    public void Error(string kind, string id, string field, string message) =>
        _issues.Add(new ValidationIssue(Severity.Error, kind, id, field, message));

    public void Warning(string kind, string id, string field, string message) =>
        _issues.Add(new ValidationIssue(Severity.Warning, kind, id, field, message));
}
