using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Errors;

/// <summary>A stored event that cannot be read back: the file was written by something else or damaged.</summary>
public sealed class CorruptEventException(EventId eventId, string problem, Exception? inner = null)
    : Exception($"event {eventId} {problem}", inner)
{
    public EventId EventId { get; } = eventId;

    /// <summary>What is wrong, without the event's id, for instance <c>has unknown kind "x"</c>.</summary>
    public string Problem { get; } = problem;
}
