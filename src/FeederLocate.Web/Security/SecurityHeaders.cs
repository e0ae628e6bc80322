namespace FeederLocate.Web.Security;

/// <summary>
/// The headers every answer carries, pages and API alike: a Content-Security-Policy that runs only the app's
/// own script files (no inline script, no eval, no other origin), no MIME sniffing, no referrer sent elsewhere,
/// and no framing by another site.
/// </summary>
public static class SecurityHeaders
{
    /// <summary>
    /// Scripts, connections (the circuit's WebSocket included), images and fonts only from the app itself; styles
    /// also inline, because the one-line diagram and Blazor set style attributes; no plug-ins, no framing, forms
    /// post only to the app.
    /// </summary>
    public const string ContentSecurityPolicy =
        "default-src 'self'; script-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data:; font-src 'self'; " +
        "connect-src 'self'; object-src 'none'; base-uri 'self'; form-action 'self'; frame-ancestors 'none'";

    public static IApplicationBuilder UseSecurityHeaders(this IApplicationBuilder app) =>
        app.Use(async (context, next) =>
        {
            context.Response.OnStarting(() =>
            {
                var headers = context.Response.Headers;
                headers.ContentSecurityPolicy = ContentSecurityPolicy;
                headers.XContentTypeOptions = "nosniff";
                headers.XFrameOptions = "DENY";
                headers["Referrer-Policy"] = "no-referrer";
                return Task.CompletedTask;
            });
            await next(context);
        });
}
