using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Security;

namespace FeederLocate.Web.Tests.Security;

/// <summary>An open page's account is checked again and again: it stays signed in only while nothing changed.</summary>
public sealed class CircuitRevalidationTests : IDisposable
{
    private static readonly Actor Engineer = new("admin", "engineer");
    private readonly TempDatabase _db = new("accounts.db");

    [Fact]
    public void A_page_stays_signed_in_until_the_account_is_disabled_or_its_role_or_password_changes()
    {
        using var accounts = new AccountDirectory(AccountStore.Open(_db.Path), TimeProvider.System);
        accounts.CreateWithPassword("admin", "Administrator", AccountRole.Engineer, "admin-password-1", null, Engineer);
        var page = AccountClaims.For(accounts.CreateWithPassword("ana", "Ana", AccountRole.Operator, "ana-password-1", null, Engineer), "Cookies");
        var other = AccountClaims.For(accounts.CreateWithPassword("ben", "Ben", AccountRole.Operator, "ben-password-1", null, Engineer), "Cookies");
        var third = AccountClaims.For(accounts.CreateWithPassword("cleo", "Cleo", AccountRole.Operator, "cleo-password-1", null, Engineer), "Cookies");

        Assert.True(CircuitRevalidation.StillValid(accounts, page));
        Assert.True(CircuitRevalidation.StillValid(accounts, new System.Security.Claims.ClaimsPrincipal()));

        accounts.Disable("ana", Engineer);
        accounts.SetRole("ben", AccountRole.Viewer, Engineer);
        accounts.ResetPassword("cleo", Engineer);

        Assert.False(CircuitRevalidation.StillValid(accounts, page));
        Assert.False(CircuitRevalidation.StillValid(accounts, other));
        Assert.False(CircuitRevalidation.StillValid(accounts, third));
    }

    public void Dispose() => _db.Dispose();
}
