using System.Globalization;
using FeederLocate.Core.Evidence;
using Microsoft.AspNetCore.OpenApi;
using Microsoft.OpenApi;

namespace FeederLocate.Web.Api;

/// <summary>Says the API's limits in the OpenAPI document: the same ones the pages and the command line apply.</summary>
public sealed class EvidenceLimitsDocument : IOpenApiDocumentTransformer
{
    public static string Text => string.Create(CultureInfo.InvariantCulture, $"""
        Limits (the pages and the command line apply the same): a request body is at most {IncidentApi.MaximumBodyBytes} bytes (413 otherwise, with or without a Content-Length) and must be valid UTF-8;
        an incident holds substation measurements of at most {EvidenceLimits.MaxMeasurementsPerIncident} devices, one record per device;
        times lie between {EvidenceLimits.EarliestTime:yyyy-MM-dd} and {EvidenceLimits.LatestTime:yyyy-MM-dd} (UTC);
        an outcome's notes hold at most {EvidenceLimits.MaxNoteChars} characters, its cause and a retraction's reason at most {EvidenceLimits.MaxCauseChars};
        switch states that no radial network explains (a loop, two substations in parallel) are refused (422), and so is an outcome on them.
        Every error is application/problem+json.
        """);

    public Task TransformAsync(OpenApiDocument document, OpenApiDocumentTransformerContext context, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(document);
        document.Info ??= new OpenApiInfo();
        document.Info.Description = string.IsNullOrEmpty(document.Info.Description) ? Text : document.Info.Description + "\n\n" + Text;
        return Task.CompletedTask;
    }
}
