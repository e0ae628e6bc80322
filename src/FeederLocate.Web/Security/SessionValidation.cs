using Microsoft.AspNetCore.Authentication;
using Microsoft.AspNetCore.Authentication.Cookies;

namespace FeederLocate.Web.Security;

/// <summary>
/// Every request with a session cookie is checked against the account: disabled, or its password, role or
/// grids changed since sign-in (a new security stamp), and the session ends at once.
/// </summary>
public static class SessionValidation
{
    public static async Task ValidateAsync(CookieValidatePrincipalContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var accounts = context.HttpContext.RequestServices.GetRequiredService<AccountDirectory>();
        var user = context.Principal;
        if (user is null || accounts.Current(AccountClaims.NameOf(user), user.FindFirst(AccountClaims.Stamp)?.Value) is null)
        {
            context.RejectPrincipal();
            await context.HttpContext.SignOutAsync(context.Scheme.Name);
        }
    }
}
