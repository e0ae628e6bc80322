using FeederLocate.Storage.Errors;
using Microsoft.AspNetCore.Diagnostics;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Web.Api;

/// <summary>
/// Every error of the API is <c>application/problem+json</c> (RFC 9457), never an HTML page: exceptions
/// (a body over the limit however it is sent: 413; the database file gone or the disk full: 503 and 507, saying
/// nothing was saved; anything else: 500 without details), bare status codes (401, 403, 404, 405), and the
/// endpoints' own 4xx answers, whose JSON bodies are marked as problems.
/// </summary>
public static class ApiProblems
{
    public const string ContentType = "application/problem+json";
    private const int SqliteFull = 13; // SQLITE_FULL, sqlite.org/rescode.html

    public static bool IsApi(HttpContext context) => context.Request.Path.StartsWithSegments("/api", StringComparison.OrdinalIgnoreCase);

    public static IApplicationBuilder UseApiProblems(this IApplicationBuilder app) =>
        app.UseWhen(IsApi, api =>
        {
            api.UseExceptionHandler(new ExceptionHandlerOptions { ExceptionHandler = WriteException, AllowStatusCode404Response = true });
            api.UseStatusCodePages(async context =>
            {
                var status = context.HttpContext.Response.StatusCode;
                await Write(context.HttpContext, status, ReasonOf(status), null);
            });
            api.Use(async (context, next) =>
            {
                context.Response.OnStarting(() =>
                {
                    if (context.Response.StatusCode >= 400 && context.Response.ContentType?.StartsWith("application/json", StringComparison.OrdinalIgnoreCase) == true)
                    {
                        context.Response.ContentType = ContentType + "; charset=utf-8";
                    }

                    return Task.CompletedTask;
                });
                await next(context);
            });
        });

    private static async Task WriteException(HttpContext context)
    {
        var error = context.Features.Get<IExceptionHandlerFeature>()?.Error;
        var (status, title, detail) = error switch
        {
            BadHttpRequestException { StatusCode: StatusCodes.Status413PayloadTooLarge } =>
                (StatusCodes.Status413PayloadTooLarge, "body too large", $"the body must be at most {IncidentApi.MaximumBodyBytes} bytes; nothing was saved"),
            BadHttpRequestException bad => (bad.StatusCode, "bad request", "the request could not be read; nothing was saved"),
            BodyNotUtf8Exception notUtf8 => (StatusCodes.Status400BadRequest, "not UTF-8", notUtf8.Message),
            EvidenceNotRadialException notRadial => (StatusCodes.Status422UnprocessableEntity, "not radial", notRadial.Message + "; nothing was saved"),
            IncidentStoreException refused => (StatusCodes.Status400BadRequest, "refused", refused.Message + "; nothing was saved"),
            DatabaseFileGoneException gone => (StatusCodes.Status503ServiceUnavailable, "not saved", gone.Message),
            SqliteException { SqliteErrorCode: SqliteFull } =>
                (StatusCodes.Status507InsufficientStorage, "not saved", "the disk holding the incident log is full; nothing was saved"),
            SqliteException => (StatusCodes.Status503ServiceUnavailable, "not saved", "the incident log could not be used; nothing was saved"),
            _ => (StatusCodes.Status500InternalServerError, "internal error", "the server failed; the log names the cause"),
        };
        await Write(context, status, title, detail);
    }

    private static async Task Write(HttpContext context, int status, string title, string? detail)
    {
        context.Response.StatusCode = status;
        context.Response.ContentType = ContentType + "; charset=utf-8";
        await context.Response.WriteAsJsonAsync(new ProblemBody(title, status, detail), ProblemBodyContext.Default.ProblemBody, ContentType + "; charset=utf-8");
    }

    private static string ReasonOf(int status) => status switch
    {
        StatusCodes.Status401Unauthorized => "a bearer token is needed",
        StatusCodes.Status403Forbidden => "this account may not do that",
        StatusCodes.Status404NotFound => "not found",
        StatusCodes.Status405MethodNotAllowed => "method not allowed",
        StatusCodes.Status413PayloadTooLarge => "body too large",
        StatusCodes.Status415UnsupportedMediaType => "unsupported media type",
        _ => Microsoft.AspNetCore.WebUtilities.ReasonPhrases.GetReasonPhrase(status),
    };
}

/// <summary>The problem document: RFC 9457's members that apply.</summary>
public sealed record ProblemBody(string Title, int Status, string? Detail);

[System.Text.Json.Serialization.JsonSourceGenerationOptions(
    PropertyNamingPolicy = System.Text.Json.Serialization.JsonKnownNamingPolicy.CamelCase,
    DefaultIgnoreCondition = System.Text.Json.Serialization.JsonIgnoreCondition.WhenWritingNull)]
[System.Text.Json.Serialization.JsonSerializable(typeof(ProblemBody))]
internal sealed partial class ProblemBodyContext : System.Text.Json.Serialization.JsonSerializerContext;
