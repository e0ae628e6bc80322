using System.Text.Encodings.Web;
using System.Text.Json;
using FeederLocate.Web.Api;
using Microsoft.AspNetCore.Authentication;
using Microsoft.Extensions.Options;

namespace FeederLocate.Web.Security;

/// <summary>
/// Bearer tokens for the API (<c>Authorization: Bearer flt_…</c>): a valid, unrevoked token of an enabled
/// account signs the request in as that account. Refusals are JSON errors like the API's own.
/// </summary>
public sealed class ApiTokenAuthentication(
    IOptionsMonitor<AuthenticationSchemeOptions> options, ILoggerFactory logger, UrlEncoder encoder, AccountDirectory accounts)
    : AuthenticationHandler<AuthenticationSchemeOptions>(options, logger, encoder)
{
    public const string SchemeName = "ApiToken";
    private const string Prefix = "Bearer ";

    protected override Task<AuthenticateResult> HandleAuthenticateAsync()
    {
        var header = Request.Headers.Authorization.ToString();
        if (header.Length == 0)
        {
            return Task.FromResult(AuthenticateResult.NoResult());
        }

        if (!header.StartsWith(Prefix, StringComparison.OrdinalIgnoreCase))
        {
            return Task.FromResult(AuthenticateResult.Fail("the Authorization header must be \"Bearer <token>\""));
        }

        if (accounts.AuthenticateToken(header[Prefix.Length..].Trim()) is not { } found)
        {
            return Task.FromResult(AuthenticateResult.Fail("the token is unknown or revoked, or its account is disabled"));
        }

        var principal = AccountClaims.For(found.Account, SchemeName, found.Token.Id);
        return Task.FromResult(AuthenticateResult.Success(new AuthenticationTicket(principal, SchemeName)));
    }

    protected override async Task HandleChallengeAsync(AuthenticationProperties properties)
    {
        var failure = (await Context.AuthenticateAsync(SchemeName)).Failure?.Message;
        Response.StatusCode = StatusCodes.Status401Unauthorized;
        Response.Headers.WWWAuthenticate = "Bearer";
        await Write(ApiError.Single("not signed in", "request", "header", "Authorization",
            failure ?? "must carry \"Bearer <token>\": an API token issued by an engineer on the Accounts page"));
    }

    protected override async Task HandleForbiddenAsync(AuthenticationProperties properties)
    {
        Response.StatusCode = StatusCodes.Status403Forbidden;
        var role = AccountClaims.RoleOf(Context.User);
        await Write(ApiError.Single("not allowed", "account", AccountClaims.NameOf(Context.User), "role",
            $"is {(role is { } r ? Storage.Accounts.AccountRoles.Name(r) : "none")}; this request needs operator or engineer"));
    }

    private Task Write(ApiError error)
    {
        Response.ContentType = "application/json";
        return Response.WriteAsync(JsonSerializer.Serialize(error, JsonSerializerOptions.Web));
    }
}
