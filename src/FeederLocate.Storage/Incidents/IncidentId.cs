namespace FeederLocate.Storage.Incidents;

/// <summary>Id of a logged incident, given by the database when the incident is opened.</summary>
public readonly record struct IncidentId(long Value)
{
    public override string ToString() => Value.ToString(System.Globalization.CultureInfo.InvariantCulture);
}
