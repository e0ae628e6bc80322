using System.Security.Claims;
using Microsoft.AspNetCore.Components.Authorization;
using Microsoft.AspNetCore.Components.Server;

namespace FeederLocate.Web.Security;

/// <summary>
/// An open page (a live circuit) checks its account every 30 seconds the same way: a disabled account or a
/// changed password or role signs the page out, and it shows the sign-in link instead of the incident.
/// </summary>
public sealed class CircuitRevalidation(ILoggerFactory loggerFactory, AccountDirectory accounts)
    : RevalidatingServerAuthenticationStateProvider(loggerFactory)
{
    protected override TimeSpan RevalidationInterval => TimeSpan.FromSeconds(30);

    protected override Task<bool> ValidateAuthenticationStateAsync(AuthenticationState authenticationState, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(authenticationState);
        return Task.FromResult(StillValid(accounts, authenticationState.User));
    }

    /// <summary>Whether a page's account may stay signed in: nobody signed in, or an enabled account with the stamp it signed in with.</summary>
    internal static bool StillValid(AccountDirectory accounts, ClaimsPrincipal user) =>
        user.Identity?.IsAuthenticated != true
        || accounts.Current(AccountClaims.NameOf(user), user.FindFirst(AccountClaims.Stamp)?.Value) is not null;
}
