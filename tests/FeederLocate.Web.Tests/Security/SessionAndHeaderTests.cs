using System.Net;
using System.Text.RegularExpressions;
using FeederLocate.Web.Security;
using FeederLocate.Web.Tests.Support;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.HttpOverrides;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.Extensions.Logging.Abstractions;

namespace FeederLocate.Web.Tests.Security;

/// <summary>Sessions that end on the server, cookies that turn Secure behind a trusted proxy only, and the headers every answer carries.</summary>
public sealed partial class SessionAndHeaderTests(ApiFixture app) : IClassFixture<ApiFixture>
{
    [Fact]
    public async Task After_sign_out_a_copy_of_the_session_cookie_opens_nothing()
    {
        using var browser = app.Factory.CreateClient(new WebApplicationFactoryClientOptions { AllowAutoRedirect = false, HandleCookies = false });
        var cookies = new Dictionary<string, string>();
        var signInPage = await Send(browser, HttpMethod.Get, "/sign-in", cookies);
        var token = Token(await signInPage.Content.ReadAsStringAsync());
        await Send(browser, HttpMethod.Post, "/account/sign-in", cookies, new Dictionary<string, string>
        {
            ["__RequestVerificationToken"] = token,
            ["name"] = "admin",
            ["password"] = ApiFixture.AdministratorPassword,
            ["returnUrl"] = "/",
        });
        var copy = new Dictionary<string, string>(cookies);

        var before = await Send(browser, HttpMethod.Get, "/accounts", copy);
        var board = await Send(browser, HttpMethod.Get, "/", cookies);
        var signOut = await Send(browser, HttpMethod.Post, "/account/sign-out", cookies, new Dictionary<string, string>
        {
            ["__RequestVerificationToken"] = Token(await board.Content.ReadAsStringAsync()),
        });
        var after = await Send(browser, HttpMethod.Get, "/accounts", copy);

        Assert.Equal(HttpStatusCode.OK, before.StatusCode);
        Assert.Contains("signedOut=1", signOut.Headers.Location?.OriginalString, StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.Redirect, after.StatusCode);
        Assert.StartsWith("/sign-in", new Uri(new Uri("http://localhost"), after.Headers.Location!).AbsolutePath, StringComparison.Ordinal);
    }

    [Fact]
    public async Task The_session_cookie_is_Secure_on_https_and_HttpOnly_and_SameSite_strict()
    {
        using var browser = app.Factory.CreateClient(new WebApplicationFactoryClientOptions
        {
            AllowAutoRedirect = false,
            HandleCookies = true,
            BaseAddress = new Uri("https://localhost"),
        });

        var answer = await FormSignIn.Post(browser, "admin", ApiFixture.AdministratorPassword);

        var session = answer.Headers.GetValues("Set-Cookie").Single(c => c.StartsWith(SecurityRegistration.CookieName + "=", StringComparison.Ordinal));
        Assert.Contains("secure", session, StringComparison.OrdinalIgnoreCase);
        Assert.Contains("httponly", session, StringComparison.OrdinalIgnoreCase);
        Assert.Contains("samesite=strict", session, StringComparison.OrdinalIgnoreCase);
    }

    [Theory]
    [InlineData("192.0.2.10", "https", "203.0.113.5")] // the configured proxy (RFC 5737 documentation addresses)
    [InlineData("192.0.2.11", "http", "192.0.2.11")]   // anyone else: the headers are ignored
    [InlineData("127.0.0.1", "http", "127.0.0.1")]     // not even loopback is trusted unless configured
    public async Task Forwarded_headers_count_only_from_the_configured_proxy(string from, string scheme, string client)
    {
        var options = Microsoft.Extensions.Options.Options.Create(ProxyHeaders.Options(["192.0.2.10"]));
        HttpContext? seen = null;
        var middleware = new ForwardedHeadersMiddleware(c => { seen = c; return Task.CompletedTask; }, NullLoggerFactory.Instance, options);
        var context = new DefaultHttpContext();
        context.Connection.RemoteIpAddress = IPAddress.Parse(from);
        context.Request.Scheme = "http";
        context.Request.Headers["X-Forwarded-For"] = "203.0.113.5";
        context.Request.Headers["X-Forwarded-Proto"] = "https";

        await middleware.Invoke(context);

        Assert.Equal(scheme, seen!.Request.Scheme);
        Assert.Equal(client, seen.Connection.RemoteIpAddress!.ToString());
    }

    [Theory]
    [InlineData("/sign-in", false)]
    [InlineData("/api/grids", true)]
    [InlineData("/api/incidents/999999", true)]
    [InlineData("/openapi/v1.json", false)]
    public async Task Pages_and_api_answers_carry_the_security_headers(string path, bool withToken)
    {
        var client = withToken ? app.Client : app.Anonymous;

        var answer = await client.GetAsync(path);

        var csp = answer.Headers.GetValues("Content-Security-Policy").Single();
        Assert.Contains("script-src 'self'", csp, StringComparison.Ordinal);
        Assert.DoesNotContain("unsafe-eval", csp, StringComparison.Ordinal);
        Assert.DoesNotContain("script-src 'self' 'unsafe-inline'", csp, StringComparison.Ordinal);
        Assert.Equal("nosniff", answer.Headers.GetValues("X-Content-Type-Options").Single());
        Assert.Equal("no-referrer", answer.Headers.GetValues("Referrer-Policy").Single());
    }

    [Fact]
    public async Task A_page_has_no_inline_script_the_policy_would_block()
    {
        var html = await (await FormSignIn.SignedIn(app.Factory, "admin", ApiFixture.AdministratorPassword)).GetStringAsync("/");

        Assert.DoesNotMatch(InlineScript(), html);
    }

    [Fact]
    public async Task A_host_name_not_allowed_is_refused()
    {
        using var request = new HttpRequestMessage(HttpMethod.Get, "/sign-in");
        request.Headers.Host = "feederlocate.attacker.invalid";

        var answer = await app.Anonymous.SendAsync(request);

        Assert.Equal(HttpStatusCode.BadRequest, answer.StatusCode);
    }

    private static async Task<HttpResponseMessage> Send(HttpClient client, HttpMethod method, string path, Dictionary<string, string> cookies, Dictionary<string, string>? form = null)
    {
        using var request = new HttpRequestMessage(method, path);
        if (cookies.Count > 0)
        {
            request.Headers.Add("Cookie", string.Join("; ", cookies.Select(c => $"{c.Key}={c.Value}")));
        }

        if (form is not null)
        {
            request.Content = new FormUrlEncodedContent(form);
        }

        var answer = await client.SendAsync(request);
        if (answer.Headers.TryGetValues("Set-Cookie", out var set))
        {
            foreach (var cookie in set)
            {
                var pair = cookie.Split(';')[0];
                var eq = pair.IndexOf('=', StringComparison.Ordinal);
                cookies[pair[..eq]] = pair[(eq + 1)..];
            }
        }

        return answer;
    }

    private static string Token(string html) =>
        WebUtility.HtmlDecode(TokenPattern().Match(html) is { Success: true } m ? m.Groups[1].Value : throw new InvalidOperationException("no antiforgery token"));

    [GeneratedRegex("name=\"__RequestVerificationToken\" value=\"([^\"]+)\"")]
    private static partial Regex TokenPattern();

    // A <script> element without src (an import map included) would need 'unsafe-inline' or a hash.
    [GeneratedRegex("<script(?![^>]*\\bsrc=)[^>]*>", RegexOptions.IgnoreCase)]
    private static partial Regex InlineScript();
}
