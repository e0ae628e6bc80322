using FeederLocate.Storage.Accounts;
using FeederLocate.Web.Security;

namespace FeederLocate.Web.Tests.Security;

public sealed class FirstRunAdministratorTests : IDisposable
{
    private readonly TempDatabase _db = new("accounts.db");

    private AccountDirectory NewDirectory() =>
        new(AccountStore.Open(_db.Path), TimeProvider.System);

    [Fact]
    public void Without_a_configured_password_the_first_run_prints_a_one_time_password_that_signs_in_once_and_must_be_changed()
    {
        using var accounts = NewDirectory();
        using var console = new StringWriter();

        FirstRunAdministrator.Ensure(accounts, configuredPassword: null, console);

        var printed = System.Text.RegularExpressions.Regex.Match(console.ToString(), "One-time password: (\\S+)").Groups[1].Value;
        Assert.Matches("^[2-9a-z]{5}(-[2-9a-z]{5}){3}$", printed);
        var outcome = accounts.SignIn("admin", printed);
        Assert.Equal(SignInVerdict.MustChangePassword, outcome.Verdict);
        Assert.Equal(AccountRole.Engineer, outcome.Account!.Role);
        Assert.DoesNotContain(printed, accounts.Find("admin")!.PasswordHash, StringComparison.Ordinal);
    }

    [Fact]
    public void A_configured_password_makes_the_administrator_without_printing_any_password()
    {
        using var accounts = NewDirectory();
        using var console = new StringWriter();

        FirstRunAdministrator.Ensure(accounts, "a-configured-admin-password", console);

        Assert.DoesNotContain("a-configured-admin-password", console.ToString(), StringComparison.Ordinal);
        Assert.Equal(SignInVerdict.SignedIn, accounts.SignIn("admin", "a-configured-admin-password").Verdict);
    }

    [Fact]
    public void Once_any_account_exists_nothing_is_created_or_printed()
    {
        using var accounts = NewDirectory();
        FirstRunAdministrator.Ensure(accounts, "a-configured-admin-password", TextWriter.Null);
        using var console = new StringWriter();

        var again = FirstRunAdministrator.Ensure(accounts, null, console);

        Assert.Null(again);
        Assert.Equal(string.Empty, console.ToString());
        Assert.Equal(1, accounts.Count());
        Assert.Equal(SignInVerdict.SignedIn, accounts.SignIn("admin", "a-configured-admin-password").Verdict);
    }

    [Fact]
    public void A_configured_password_that_is_too_short_stops_the_first_run_with_the_rule()
    {
        using var accounts = NewDirectory();

        var error = Assert.Throws<InvalidOperationException>(() => FirstRunAdministrator.Ensure(accounts, "admin", TextWriter.Null));

        Assert.Contains($"at least {PasswordRules.MinimumLength} characters", error.Message, StringComparison.Ordinal);
        Assert.Equal(0, accounts.Count());
    }

    [Fact]
    public void A_wrong_name_and_a_wrong_password_get_the_same_answer()
    {
        using var accounts = NewDirectory();
        FirstRunAdministrator.Ensure(accounts, "a-configured-admin-password", TextWriter.Null);

        Assert.Equal(SignInVerdict.WrongNameOrPassword, accounts.SignIn("nobody", "a-configured-admin-password").Verdict);
        Assert.Equal(SignInVerdict.WrongNameOrPassword, accounts.SignIn("admin", "not-the-password").Verdict);
    }

    [Fact]
    public void A_reset_gives_a_demoted_disabled_administrator_a_printed_one_time_password_and_the_engineer_role_again()
    {
        using var accounts = NewDirectory();
        FirstRunAdministrator.Ensure(accounts, "a-configured-admin-password", TextWriter.Null);
        var by = new FeederLocate.Storage.Events.Actor("someone", "engineer");
        accounts.CreateWithPassword("other", "Other engineer", AccountRole.Engineer, "other-password-1", null, by);
        accounts.SetRole("admin", AccountRole.Viewer, by);
        accounts.Disable("admin", by);
        using var console = new StringWriter();

        FirstRunAdministrator.Reset(accounts, console);

        var printed = System.Text.RegularExpressions.Regex.Match(console.ToString(), "One-time password: (\\S+)").Groups[1].Value;
        var outcome = accounts.SignIn("admin", printed);
        Assert.Equal(SignInVerdict.MustChangePassword, outcome.Verdict);
        Assert.Equal(AccountRole.Engineer, outcome.Account!.Role);
        Assert.Equal(SignInVerdict.WrongNameOrPassword, accounts.SignIn("admin", "a-configured-admin-password").Verdict);
    }

    public void Dispose() => _db.Dispose();
}
