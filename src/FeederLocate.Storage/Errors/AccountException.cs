namespace FeederLocate.Storage.Errors;

/// <summary>An account or token change the store refuses: <see cref="Subject"/> names the account or token, <see cref="Field"/> the field at fault.</summary>
public sealed class AccountException(string subject, string field, string message) : Exception($"{subject}: {field} {message}")
{
    public string Subject { get; } = subject;

    public string Field { get; } = field;

    /// <summary>The problem alone, without subject and field.</summary>
    public string Problem { get; } = message;
}
