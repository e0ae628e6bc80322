using System.Globalization;
using Microsoft.AspNetCore.Authentication;
using Microsoft.AspNetCore.Authentication.Cookies;
using Microsoft.AspNetCore.Antiforgery;

namespace FeederLocate.Web.Security;

/// <summary>
/// The form posts of signing in, changing one's password and signing out. Each form carries an
/// antiforgery token, which ASP.NET Core checks before the handler runs (a post without it is a 400).
/// </summary>
public static class AccountEndpoints
{
    public const string SignInPage = "/sign-in";
    public const string PasswordPage = "/account/password";

    public static IEndpointRouteBuilder MapAccountEndpoints(this IEndpointRouteBuilder app)
    {
        app.MapPost("/account/sign-in", (HttpContext http, AccountDirectory accounts) => WithForm(http, form => SignIn(http, accounts, form)))
            .AllowAnonymous().WithMetadata(new RequireAntiforgeryTokenAttribute()).ExcludeFromDescription();
        app.MapPost("/account/new-password", (HttpContext http, AccountDirectory accounts) => WithForm(http, form => ChangePassword(http, accounts, form)))
            .RequireAuthorization().WithMetadata(new RequireAntiforgeryTokenAttribute()).ExcludeFromDescription();
        app.MapPost("/account/sign-out", (Func<HttpContext, Task<IResult>>)(http => WithForm(http, _ => SignOut(http))))
            .WithMetadata(new RequireAntiforgeryTokenAttribute()).ExcludeFromDescription();
        return app;
    }

    /// <summary>A form post whose antiforgery token is missing or wrong is a plain 400, and its form is never read.</summary>
    private static async Task<IResult> WithForm(HttpContext http, Func<IFormCollection, Task<IResult>> handle)
    {
        if (http.Features.Get<IAntiforgeryValidationFeature>() is { IsValid: false })
        {
            return Results.Text("The form has no valid antiforgery token: reload the page and send it again.", statusCode: StatusCodes.Status400BadRequest);
        }

        if (!http.Request.HasFormContentType)
        {
            return Results.Text("Expected a form post.", statusCode: StatusCodes.Status400BadRequest);
        }

        return await handle(await http.Request.ReadFormAsync());
    }

    private static async Task<IResult> SignIn(HttpContext http, AccountDirectory accounts, IFormCollection form)
    {
        var back = LocalReturnUrl.Or(form["returnUrl"]);
        var outcome = accounts.SignIn(form["name"], form["password"], SignInClient.Of(http));
        switch (outcome.Verdict)
        {
            case SignInVerdict.Throttled:
                var seconds = (int)Math.Ceiling(outcome.RetryAfter?.TotalSeconds ?? 1);
                http.Response.Headers.RetryAfter = seconds.ToString(CultureInfo.InvariantCulture);
                return Results.LocalRedirect($"{SignInPage}?failed=wait&seconds={seconds}&returnUrl={Uri.EscapeDataString(back)}");
            case SignInVerdict.WrongNameOrPassword:
                return Results.LocalRedirect($"{SignInPage}?failed=wrong&returnUrl={Uri.EscapeDataString(back)}");
        }

        await http.SignInAsync(CookieAuthenticationDefaults.AuthenticationScheme,
            AccountClaims.For(outcome.Account!, CookieAuthenticationDefaults.AuthenticationScheme));
        return outcome.Verdict == SignInVerdict.MustChangePassword
            ? Results.LocalRedirect($"{PasswordPage}?returnUrl={Uri.EscapeDataString(back)}")
            : Results.LocalRedirect(back);
    }

    private static async Task<IResult> ChangePassword(HttpContext http, AccountDirectory accounts, IFormCollection form)
    {
        var back = LocalReturnUrl.Or(form["returnUrl"]);
        string? currentPassword = form["currentPassword"], newPassword = form["newPassword"], confirmPassword = form["confirmPassword"];
        var name = AccountClaims.NameOf(http.User);
        var problem = !string.Equals(newPassword, confirmPassword, StringComparison.Ordinal)
            ? PasswordProblems.Mismatch
            : accounts.ChangePassword(name, currentPassword, newPassword);
        if (problem is not null)
        {
            var code = PasswordProblems.CodeOf(problem)?.ToString(CultureInfo.InvariantCulture) ?? "unknown";
            return Results.LocalRedirect($"{PasswordPage}?problem={code}&returnUrl={Uri.EscapeDataString(back)}");
        }

        // A new password is a new security stamp: sign in again with it, so this session stays and every other one ends.
        await http.SignInAsync(CookieAuthenticationDefaults.AuthenticationScheme,
            AccountClaims.For(accounts.Find(name)!, CookieAuthenticationDefaults.AuthenticationScheme));
        return Results.LocalRedirect(back);
    }

    private static async Task<IResult> SignOut(HttpContext http)
    {
        // The cookie alone is not trusted to go away: the account's stamp changes, so a copy of it opens nothing.
        if (http.User.Identity?.IsAuthenticated == true)
        {
            var accounts = http.RequestServices.GetRequiredService<AccountDirectory>();
            accounts.EndSessions(AccountClaims.NameOf(http.User), AccountClaims.ActorOf(http.User));
        }

        await http.SignOutAsync(CookieAuthenticationDefaults.AuthenticationScheme);
        return Results.LocalRedirect($"{SignInPage}?signedOut=1");
    }
}
