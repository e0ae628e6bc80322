namespace FeederLocate.Storage.Events;

/// <summary>Id of a logged event, unique in the database and increasing in the order events were committed.</summary>
public readonly record struct EventId(long Value)
{
    public override string ToString() => Value.ToString(System.Globalization.CultureInfo.InvariantCulture);
}
