namespace FeederLocate.Storage.Incidents;

public enum IncidentStatus
{
    Open,
    Closed,
}
