using System.Net;
using System.Text.RegularExpressions;
using Microsoft.AspNetCore.Mvc.Testing;

namespace FeederLocate.Web.Tests.Support;

/// <summary>Signs in through the sign-in page's form, as a browser does: page, antiforgery token, post.</summary>
public static partial class FormSignIn
{
    /// <summary>A client that keeps cookies and does not follow redirects, so each answer can be looked at.</summary>
    public static HttpClient NewBrowser(WebApplicationFactory<Program> factory) =>
        factory.CreateClient(new WebApplicationFactoryClientOptions { AllowAutoRedirect = false, HandleCookies = true });

    public static async Task<string> AntiforgeryToken(HttpClient browser, string page = "/sign-in")
    {
        var html = await browser.GetStringAsync(page);
        return TokenPattern().Match(html) is { Success: true } m
            ? WebUtility.HtmlDecode(m.Groups[1].Value)
            : throw new InvalidOperationException($"{page} has no antiforgery token");
    }

    /// <summary>Posts the sign-in form; returns the answer (a redirect).</summary>
    public static async Task<HttpResponseMessage> Post(HttpClient browser, string name, string password, string returnUrl = "/")
    {
        var token = await AntiforgeryToken(browser);
        return await browser.PostAsync("/account/sign-in", new FormUrlEncodedContent(new Dictionary<string, string>
        {
            ["__RequestVerificationToken"] = token,
            ["name"] = name,
            ["password"] = password,
            ["returnUrl"] = returnUrl,
        }));
    }

    public static async Task<HttpClient> SignedIn(WebApplicationFactory<Program> factory, string name, string password)
    {
        var browser = NewBrowser(factory);
        var answer = await Post(browser, name, password);
        if (answer.StatusCode != HttpStatusCode.Redirect || answer.Headers.Location?.OriginalString.Contains("failed", StringComparison.Ordinal) == true)
        {
            throw new InvalidOperationException($"signing in as {name} failed: {answer.StatusCode} {answer.Headers.Location}");
        }

        return browser;
    }

    [GeneratedRegex("name=\"__RequestVerificationToken\" value=\"([^\"]+)\"")]
    private static partial Regex TokenPattern();
}
