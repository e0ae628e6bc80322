using FeederLocate.Storage.Accounts;
using Microsoft.AspNetCore.Authentication;
using Microsoft.AspNetCore.Authentication.Cookies;
using Microsoft.AspNetCore.Components.Authorization;

namespace FeederLocate.Web.Security;

/// <summary>Sign-in (session cookie for pages, bearer tokens for the API), roles and accounts, registered in one place.</summary>
public static class SecurityRegistration
{
    public const string CookieName = "FeederLocate.Session";

    public static IServiceCollection AddFeederLocateSecurity(this IServiceCollection services, string databasePath, int freeFailuresPerClient = SignInThrottle.DefaultFreeFailures)
    {
        services.AddSingleton(sp => new AccountDirectory(
            AccountStore.Open(databasePath, sp.GetRequiredService<TimeProvider>()),
            sp.GetRequiredService<TimeProvider>(),
            new SignInThrottle(sp.GetRequiredService<TimeProvider>(), freeFailuresPerClient)));
        services.AddAuthentication(CookieAuthenticationDefaults.AuthenticationScheme)
            .AddCookie(options =>
            {
                options.LoginPath = AccountEndpoints.SignInPage;
                options.AccessDeniedPath = "/access-denied";
                options.ReturnUrlParameter = "returnUrl";
                options.Cookie.Name = CookieName;
                options.Cookie.HttpOnly = true;
                options.Cookie.SameSite = SameSiteMode.Strict;
                options.Cookie.SecurePolicy = CookieSecurePolicy.SameAsRequest;
                options.ExpireTimeSpan = TimeSpan.FromHours(12);
                options.SlidingExpiration = true;
                options.Events.OnValidatePrincipal = SessionValidation.ValidateAsync;
            })
            .AddScheme<AuthenticationSchemeOptions, ApiTokenAuthentication>(ApiTokenAuthentication.SchemeName, null);
        services.AddAuthorization(AccessPolicies.Add);
        services.AddCascadingAuthenticationState();
        services.AddScoped<AuthenticationStateProvider, CircuitRevalidation>();
        return services;
    }
}
