using Microsoft.AspNetCore.OpenApi;
using Microsoft.OpenApi;

namespace FeederLocate.Web.Api;

/// <summary>Says in the OpenAPI document that every API request needs a bearer token.</summary>
public sealed class BearerTokenDocument : IOpenApiDocumentTransformer
{
    public const string SchemeName = "apiToken";

    public Task TransformAsync(OpenApiDocument document, OpenApiDocumentTransformerContext context, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(document);
        document.Components ??= new OpenApiComponents();
        document.Components.SecuritySchemes ??= new Dictionary<string, IOpenApiSecurityScheme>();
        document.Components.SecuritySchemes[SchemeName] = new OpenApiSecurityScheme
        {
            Type = SecuritySchemeType.Http,
            Scheme = "bearer",
            Description = "An API token (flt_…) issued by an engineer on the Accounts page; it acts as its account and role.",
        };
        document.Security = [new OpenApiSecurityRequirement { [new OpenApiSecuritySchemeReference(SchemeName, document)] = [] }];
        return Task.CompletedTask;
    }
}
