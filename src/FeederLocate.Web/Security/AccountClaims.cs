using System.Security.Claims;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;

namespace FeederLocate.Web.Security;

/// <summary>
/// What a signed-in session or a token says about its account: name, display name, roles (each role with
/// the roles it includes), the grids it may see, and the security stamp it was issued with.
/// </summary>
public static class AccountClaims
{
    public const string DisplayName = "feederlocate/display-name";
    public const string Grid = "feederlocate/grid";
    public const string EveryGrid = "feederlocate/every-grid";
    public const string Stamp = "feederlocate/stamp";
    public const string MustChangePassword = "feederlocate/must-change-password";
    public const string Token = "feederlocate/token";

    /// <summary>The principal of an account, for <paramref name="scheme"/>; a session that must change its password first carries no role.</summary>
    public static ClaimsPrincipal For(Account account, string scheme, long? tokenId = null)
    {
        ArgumentNullException.ThrowIfNull(account);
        var claims = new List<Claim>
        {
            new(ClaimTypes.Name, account.Name),
            new(DisplayName, account.DisplayName),
            new(Stamp, account.SecurityStamp),
        };
        if (account.MustChangePassword && tokenId is null)
        {
            claims.Add(new Claim(MustChangePassword, "true"));
        }
        else
        {
            claims.AddRange(AccountRoles.All.Where(r => r <= account.Role).Select(r => new Claim(ClaimTypes.Role, AccountRoles.Name(r))));
        }

        if (account.Grids is { } grids)
        {
            claims.AddRange(grids.Select(g => new Claim(Grid, g)));
        }
        else
        {
            claims.Add(new Claim(EveryGrid, "true"));
        }

        if (tokenId is { } id)
        {
            claims.Add(new Claim(Token, id.ToString(System.Globalization.CultureInfo.InvariantCulture)));
        }

        return new ClaimsPrincipal(new ClaimsIdentity(claims, scheme, ClaimTypes.Name, ClaimTypes.Role));
    }

    public static string NameOf(ClaimsPrincipal user) => user?.Identity?.Name ?? string.Empty;

    public static string DisplayNameOf(ClaimsPrincipal user) => user.FindFirst(DisplayName)?.Value ?? NameOf(user);

    /// <summary>The highest role the principal holds, or null (not signed in, or a password still to change).</summary>
    public static AccountRole? RoleOf(ClaimsPrincipal user)
    {
        ArgumentNullException.ThrowIfNull(user);
        AccountRole? highest = null;
        foreach (var claim in user.FindAll(ClaimTypes.Role))
        {
            if (AccountRoles.TryParse(claim.Value, out var role) && (highest is null || role > highest))
            {
                highest = role;
            }
        }

        return highest;
    }

    public static bool Holds(ClaimsPrincipal user, AccountRole role) => RoleOf(user) is { } held && held >= role;

    /// <summary>Whether the principal may see incidents of the grid named <paramref name="gridName"/>.</summary>
    public static bool MaySee(ClaimsPrincipal user, string gridName)
    {
        ArgumentNullException.ThrowIfNull(user);
        return RoleOf(user) is not null
            && (user.HasClaim(c => c.Type == EveryGrid) || user.FindAll(Grid).Any(c => string.Equals(c.Value, gridName, StringComparison.Ordinal)));
    }

    /// <summary>Who the event log names for changes made by this principal: the account and its role.</summary>
    public static Actor ActorOf(ClaimsPrincipal user)
    {
        ArgumentNullException.ThrowIfNull(user);
        var name = NameOf(user);
        if (name.Length == 0 || RoleOf(user) is not { } role)
        {
            throw new InvalidOperationException("only a signed-in account with a role can change the log");
        }

        return new Actor(name, AccountRoles.Name(role));
    }
}
