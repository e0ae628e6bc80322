using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Tests.Support;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Tests.Accounts;

public class AccountStoreTests
{
    // The store keeps whatever the caller's hasher gives; these stand for hasher output.
    private const string HashOne = "hash-one";
    private const string HashTwo = "hash-two";

    [Fact]
    public void An_account_is_kept_with_its_role_grids_and_creator_and_the_change_is_logged()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = AccountStore.Open(db.Path, clock);

        var created = store.Create("ana.field", "Ana Field", AccountRole.Operator, HashOne, mustChangePassword: true, ["North 20 kV"], "admin");

        var found = store.Find("ana.field")!;
        Assert.Equal(created.SecurityStamp, found.SecurityStamp);
        Assert.Equal("Ana Field", found.DisplayName);
        Assert.Equal(AccountRole.Operator, found.Role);
        Assert.Equal(HashOne, found.PasswordHash);
        Assert.True(found.MustChangePassword);
        Assert.Equal(new[] { "North 20 kV" }, found.Grids!.Value.ToArray());
        Assert.True(found.MaySee("North 20 kV"));
        Assert.False(found.MaySee("South 20 kV"));
        Assert.Equal(TestClock.Start, found.CreatedAt);
        Assert.Equal("admin", found.CreatedBy);
        Assert.Equal(1, store.Count());
        var change = Assert.Single(store.Changes());
        Assert.Equal(("admin", "create", "ana.field"), (change.Actor, change.Action, change.Subject));
    }

    [Theory]
    [InlineData("")]
    [InlineData("Ana")]
    [InlineData("-ana")]
    [InlineData("ana field")]
    [InlineData("<b>ana</b>")]
    [InlineData("a23456789012345678901234567890123")]
    public void A_malformed_account_name_is_refused_naming_the_field(string name)
    {
        using var db = new TempDatabase();
        using var store = AccountStore.Open(db.Path);

        var error = Assert.Throws<AccountException>(() => store.Create(name, "Someone", AccountRole.Viewer, HashOne, false, null, "admin"));

        Assert.Equal("name", error.Field);
        Assert.Equal(0, store.Count());
    }

    [Fact]
    public void A_taken_name_is_refused_and_the_first_account_is_unchanged()
    {
        using var db = new TempDatabase();
        using var store = AccountStore.Open(db.Path);
        var first = store.Create("ana", "Ana", AccountRole.Viewer, HashOne, false, null, "admin");

        var error = Assert.Throws<AccountException>(() => store.Create("ana", "Another Ana", AccountRole.Engineer, HashTwo, false, null, "admin"));

        Assert.Equal("name", error.Field);
        Assert.Equal(first, store.Find("ana"));
    }

    [Fact]
    public void A_display_name_with_markup_is_kept_as_given_for_the_page_to_show_as_text()
    {
        using var db = new TempDatabase();
        using var store = AccountStore.Open(db.Path);

        store.Create("mallory", "<script>alert(1)</script>", AccountRole.Viewer, HashOne, false, null, "admin");

        Assert.Equal("<script>alert(1)</script>", store.Find("mallory")!.DisplayName);
    }

    [Fact]
    public void Every_change_of_password_role_grids_or_status_gives_a_new_security_stamp()
    {
        using var db = new TempDatabase();
        using var store = AccountStore.Open(db.Path);
        var stamps = new List<string> { store.Create("ana", "Ana", AccountRole.Viewer, HashOne, true, null, "admin").SecurityStamp };

        stamps.Add(store.SetPassword("ana", HashTwo, mustChangePassword: false, "ana").SecurityStamp);
        stamps.Add(store.SetRole("ana", AccountRole.Operator, "admin").SecurityStamp);
        stamps.Add(store.SetGrids("ana", ["North"], "admin").SecurityStamp);
        stamps.Add(store.Disable("ana", "admin").SecurityStamp);
        stamps.Add(store.Enable("ana", "admin").SecurityStamp);

        Assert.Equal(stamps.Count, stamps.Distinct().Count());
        var ana = store.Find("ana")!;
        Assert.Equal((HashTwo, false, AccountRole.Operator, false), (ana.PasswordHash, ana.MustChangePassword, ana.Role, ana.IsDisabled));
        Assert.Equal(["enable", "disable", "set grids", "set role", "change password", "create"], store.Changes().Select(c => c.Action));
    }

    [Fact]
    public void Failed_sign_ins_lock_the_account_at_the_limit_and_a_new_password_unlocks_it()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = AccountStore.Open(db.Path, clock);
        store.Create("ana", "Ana", AccountRole.Operator, HashOne, false, null, "admin");

        for (var i = 0; i < 4; i++)
        {
            Assert.False(store.RecordFailedSignIn("ana", lockAfter: 5, TimeSpan.FromMinutes(15)).IsLockedAt(clock.GetUtcNow()));
        }

        var locked = store.RecordFailedSignIn("ana", lockAfter: 5, TimeSpan.FromMinutes(15));

        Assert.True(locked.IsLockedAt(clock.At(14)));
        Assert.False(locked.IsLockedAt(clock.At(16)));
        Assert.Null(store.SetPassword("ana", HashTwo, true, "admin").LockedUntil);
    }

    [Fact]
    public void A_successful_sign_in_clears_the_count_of_failures()
    {
        using var db = new TempDatabase();
        using var store = AccountStore.Open(db.Path);
        store.Create("ana", "Ana", AccountRole.Operator, HashOne, false, null, "admin");
        store.RecordFailedSignIn("ana", 5, TimeSpan.FromMinutes(15));
        store.RecordFailedSignIn("ana", 5, TimeSpan.FromMinutes(15));

        store.RecordSuccessfulSignIn("ana");

        Assert.Equal(0, store.Find("ana")!.FailedSignIns);
    }

    [Fact]
    public void A_token_authenticates_as_its_account_until_revoked_and_only_its_hash_is_kept()
    {
        using var db = new TempDatabase();
        using var store = AccountStore.Open(db.Path);
        store.Create("telecontrol", "Telecontrol gateway", AccountRole.Operator, HashOne, false, null, "admin");

        var issued = store.IssueToken("telecontrol", "gateway 1", "admin");

        Assert.StartsWith(ApiTokenSecret.Mark, issued.Secret, StringComparison.Ordinal);
        Assert.True(issued.Secret.Length >= 40);
        var (token, account) = store.Authenticate(issued.Secret)!.Value;
        Assert.Equal((issued.Token.Id, "telecontrol"), (token.Id, account.Name));
        Assert.Null(store.Authenticate(issued.Secret + "x"));
        Assert.Null(store.Authenticate(string.Empty));

        using (var raw = RawDatabase.Open(db.Path))
        {
            Assert.Equal(0, RawDatabase.Long(raw, $"SELECT COUNT(*) FROM api_tokens WHERE secret_sha256 = '{issued.Secret}' OR prefix = '{issued.Secret}'"));
            Assert.Equal(1, RawDatabase.Long(raw, $"SELECT COUNT(*) FROM api_tokens WHERE secret_sha256 = '{ApiTokenSecret.Sha256Hex(issued.Secret)}'"));
        }

        var revoked = store.Revoke(issued.Token.Id, "admin");

        Assert.True(revoked.IsRevoked);
        Assert.Equal("admin", revoked.RevokedBy);
        Assert.Null(store.Authenticate(issued.Secret));
    }

    [Fact]
    public void A_token_of_a_disabled_account_is_refused()
    {
        using var db = new TempDatabase();
        using var store = AccountStore.Open(db.Path);
        store.Create("telecontrol", "Telecontrol gateway", AccountRole.Operator, HashOne, false, null, "admin");
        var issued = store.IssueToken("telecontrol", "gateway 1", "admin");

        store.Disable("telecontrol", "admin");

        Assert.Null(store.Authenticate(issued.Secret));
    }

    [Fact]
    public void Two_tokens_have_different_secrets()
    {
        using var db = new TempDatabase();
        using var store = AccountStore.Open(db.Path);
        store.Create("telecontrol", "Telecontrol gateway", AccountRole.Operator, HashOne, false, null, "admin");

        var secrets = Enumerable.Range(0, 20).Select(i => store.IssueToken("telecontrol", $"gateway {i}", "admin").Secret).ToList();

        Assert.Equal(20, secrets.Distinct().Count());
        Assert.Equal(20, store.Tokens("telecontrol").Count);
    }

    [Fact]
    public void SHA256_of_a_known_text_matches_the_published_test_vector()
    {
        // FIPS 180-2, appendix B.1: SHA-256("abc").
        Assert.Equal("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad", ApiTokenSecret.Sha256Hex("abc"));
    }

    [Fact]
    public void Accounts_are_never_deleted_and_account_changes_are_never_rewritten()
    {
        using var db = new TempDatabase();
        using (var store = AccountStore.Open(db.Path))
        {
            store.Create("ana", "Ana", AccountRole.Viewer, HashOne, false, null, "admin");
        }

        using var raw = RawDatabase.Open(db.Path);
        Assert.Throws<SqliteException>(() => RawDatabase.Long(raw, "DELETE FROM accounts RETURNING 1"));
        Assert.Throws<SqliteException>(() => RawDatabase.Long(raw, "UPDATE account_changes SET actor = 'someone' RETURNING 1"));
        Assert.Throws<SqliteException>(() => RawDatabase.Long(raw, "DELETE FROM account_changes RETURNING 1"));
    }

    [Fact]
    public void An_unknown_account_or_token_is_refused_naming_it()
    {
        using var db = new TempDatabase();
        using var store = AccountStore.Open(db.Path);

        Assert.Equal("account \"nobody\"", Assert.Throws<AccountException>(() => store.SetRole("nobody", AccountRole.Engineer, "admin")).Subject);
        Assert.Equal("token 7", Assert.Throws<AccountException>(() => store.Revoke(7, "admin")).Subject);
        Assert.Throws<AccountException>(() => store.IssueToken("nobody", "x", "admin"));
    }
}
