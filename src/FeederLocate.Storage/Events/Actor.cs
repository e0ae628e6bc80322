namespace FeederLocate.Storage.Events;

/// <summary>Who logged an event: an account name ("cli", an operator's name) and optionally their role.</summary>
public sealed record Actor
{
    public Actor(string name, string? role = null)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        if (role is not null)
        {
            ArgumentException.ThrowIfNullOrWhiteSpace(role);
        }

        Name = name;
        Role = role;
    }

    public string Name { get; }

    /// <summary>For instance operator, engineer, crew or system; null when not given.</summary>
    public string? Role { get; }

    public override string ToString() => Role is null ? Name : $"{Name} ({Role})";
}
