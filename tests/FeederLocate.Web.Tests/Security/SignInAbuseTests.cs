using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Security;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Security;

/// <summary>Guessing is slowed per client, answers tell nothing about which names exist, and a lock never shuts out the machine itself.</summary>
public sealed class SignInAbuseTests : IDisposable
{
    private static readonly Actor Setup = new("setup", "engineer");
    private static readonly SignInClient Guesser = new("198.51.100.7", false);   // RFC 5737 documentation address
    private static readonly SignInClient Colleague = new("198.51.100.8", false);
    private static readonly SignInClient ThisMachine = new("127.0.0.1", true);
    private readonly string _folder = Directory.CreateTempSubdirectory("feederlocate-sign-in-abuse-").FullName;
    private readonly Microsoft.Extensions.Time.Testing.FakeTimeProvider _clock = TestClock.Manual();
    private readonly AccountDirectory _accounts;

    public SignInAbuseTests()
    {
        _accounts = new AccountDirectory(AccountStore.Open(Path.Combine(_folder, "accounts.db"), _clock), _clock);
        _accounts.CreateWithPassword("chief", "Chief engineer", AccountRole.Engineer, "the-chief-password", null, Setup);
    }

    [Fact]
    public void After_five_failures_a_client_waits_1_then_2_then_4_seconds_and_others_are_not_slowed()
    {
        for (var i = 0; i < SignInThrottle.DefaultFreeFailures; i++)
        {
            Assert.Equal(SignInVerdict.WrongNameOrPassword, _accounts.SignIn($"name-{i}", "guess", Guesser).Verdict);
        }

        var waits = new List<TimeSpan?>();
        for (var round = 0; round < 3; round++)
        {
            var refused = _accounts.SignIn("chief", "the-chief-password", Guesser);
            Assert.Equal(SignInVerdict.Throttled, refused.Verdict);
            waits.Add(refused.RetryAfter);
            _clock.Advance(refused.RetryAfter!.Value);
            Assert.Equal(SignInVerdict.WrongNameOrPassword, _accounts.SignIn("someone", "guess", Guesser).Verdict);
        }

        Assert.Equal([TimeSpan.FromSeconds(1), TimeSpan.FromSeconds(2), TimeSpan.FromSeconds(4)], waits);
        Assert.Equal(SignInVerdict.SignedIn, _accounts.SignIn("chief", "the-chief-password", Colleague).Verdict);
        _clock.Advance(SignInThrottle.ForgetAfter);
        Assert.Equal(SignInVerdict.SignedIn, _accounts.SignIn("chief", "the-chief-password", Guesser).Verdict);
    }

    [Fact]
    public void Unknown_names_wrong_passwords_disabled_and_locked_accounts_get_one_answer()
    {
        _accounts.CreateWithPassword("leaver", "Leaver", AccountRole.Operator, "the-leaver-password", null, Setup);
        _accounts.Disable("leaver", Setup);
        // Each attempt from another address (RFC 5737 documentation range), so no throttle hides the answers.
        static SignInClient From(int host) => new($"203.0.113.{host}", false);
        for (var i = 0; i < AccountDirectory.LockAfterFailures; i++)
        {
            _accounts.SignIn("chief", "not-it", From(i));
        }

        var answers = new[]
        {
            _accounts.SignIn("nobody-by-this-name", "whatever", From(10)),
            _accounts.SignIn("chief", "not-it", From(11)),
            _accounts.SignIn("leaver", "the-leaver-password", From(12)),
            _accounts.SignIn("chief", "the-chief-password", From(13)),
        };

        Assert.True(_accounts.Find("chief")!.IsLockedAt(_clock.GetUtcNow()));
        Assert.All(answers, a => Assert.Equal(new SignInOutcome(SignInVerdict.WrongNameOrPassword), a));
    }

    [Fact]
    public void A_locked_engineer_still_signs_in_from_the_machine_itself()
    {
        for (var i = 0; i < AccountDirectory.LockAfterFailures; i++)
        {
            _accounts.SignIn("chief", "not-it", Guesser);
        }

        var fromElsewhere = _accounts.SignIn("chief", "the-chief-password", Colleague);
        var fromHere = _accounts.SignIn("chief", "the-chief-password", ThisMachine);

        Assert.Equal(SignInVerdict.WrongNameOrPassword, fromElsewhere.Verdict);
        Assert.Equal(SignInVerdict.SignedIn, fromHere.Verdict);
    }

    public void Dispose()
    {
        _accounts.Dispose();
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        Directory.Delete(_folder, recursive: true);
    }
}
