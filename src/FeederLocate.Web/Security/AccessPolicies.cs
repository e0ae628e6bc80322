using FeederLocate.Storage.Accounts;
using Microsoft.AspNetCore.Authorization;

namespace FeederLocate.Web.Security;

/// <summary>The authorisation policies: pages through the session cookie, the API through bearer tokens only (so no page can be tricked into posting to it).</summary>
public static class AccessPolicies
{
    public const string View = "view";
    public const string Operate = "operate";
    public const string Engineer = "engineer";
    public const string ApiRead = "api-read";
    public const string ApiWrite = "api-write";
    public const string ApiEngineer = "api-engineer";

    public static void Add(AuthorizationOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        options.AddPolicy(View, p => p.RequireAuthenticatedUser().RequireRole(AccountRoles.Name(AccountRole.Viewer)));
        options.AddPolicy(Operate, p => p.RequireAuthenticatedUser().RequireRole(AccountRoles.Name(AccountRole.Operator)));
        options.AddPolicy(Engineer, p => p.RequireAuthenticatedUser().RequireRole(AccountRoles.Name(AccountRole.Engineer)));
        options.AddPolicy(ApiRead, p => p.AddAuthenticationSchemes(ApiTokenAuthentication.SchemeName).RequireAuthenticatedUser()
            .RequireRole(AccountRoles.Name(AccountRole.Viewer)));
        options.AddPolicy(ApiWrite, p => p.AddAuthenticationSchemes(ApiTokenAuthentication.SchemeName).RequireAuthenticatedUser()
            .RequireRole(AccountRoles.Name(AccountRole.Operator)));
        options.AddPolicy(ApiEngineer, p => p.AddAuthenticationSchemes(ApiTokenAuthentication.SchemeName).RequireAuthenticatedUser()
            .RequireRole(AccountRoles.Name(AccountRole.Engineer)));
    }
}
