using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Errors;

/// <summary>An event was given with a grid other than the incident's, or names an element that grid lacks.</summary>
public sealed class IncidentGridMismatchException : IncidentStoreException
{
    private IncidentGridMismatchException(IncidentId incident, string incidentGrid, string givenGrid, string? element, string message)
        : base(incident, message)
    {
        IncidentGrid = incidentGrid;
        GivenGrid = givenGrid;
        Element = element;
    }

    /// <summary>The grid name the incident was opened on.</summary>
    public string IncidentGrid { get; }

    /// <summary>The grid name the event came with.</summary>
    public string GivenGrid { get; }

    /// <summary>The element the grid lacks, as "indicator FPI9"; null when the grid names differ.</summary>
    public string? Element { get; }

    internal static IncidentGridMismatchException OtherGrid(IncidentId incident, string incidentGrid, string givenGrid) =>
        new(incident, incidentGrid, givenGrid, null,
            $"incident {incident} belongs to grid \"{incidentGrid}\", not \"{givenGrid}\"");

    internal static IncidentGridMismatchException MissingElement(IncidentId incident, string grid, string element) =>
        new(incident, grid, grid, element,
            $"incident {incident}: {element} is not in grid \"{grid}\"");
}
