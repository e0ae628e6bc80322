using System.Net;
using System.Net.Sockets;

namespace FeederLocate.Web.Hosting;

/// <summary>
/// Where the app listens: <c>--urls</c>, else <c>ASPNETCORE_URLS</c> (or <c>DOTNET_URLS</c>), else
/// <see cref="Default"/>. Checked before anything is created, so a busy port costs one clear line.
/// </summary>
public static class ListenAddresses
{
    public const string Default = "http://127.0.0.1:5080";

    /// <summary>The addresses the app would listen on for these arguments and this environment.</summary>
    public static IReadOnlyList<string> For(string[] args)
    {
        var configuration = new ConfigurationBuilder()
            .SetBasePath(AppContext.BaseDirectory)
            .AddJsonFile("appsettings.json", optional: true)
            .AddEnvironmentVariables("DOTNET_")
            .AddEnvironmentVariables("ASPNETCORE_")
            .AddCommandLine(args)
            .Build();
        return Split(configuration[WebHostDefaults.ServerUrlsKey] ?? Default);
    }

    public static IReadOnlyList<string> Split(string urls) =>
        [.. urls.Split(';', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries)];

    /// <summary>One line naming the first address whose port is taken (or not allowed), or null when all are free.</summary>
    public static string? Problem(IEnumerable<string> urls)
    {
        ArgumentNullException.ThrowIfNull(urls);
        foreach (var url in urls)
        {
            if (!BindingAddress.TryParse(url, out var host, out var port))
            {
                return $"FeederLocate cannot start: \"{url}\" is not an address to listen on (for example {Default}).";
            }

            if (port == 0)
            {
                continue;
            }

            try
            {
                var listener = new TcpListener(host, port);
                listener.Start();
                listener.Stop();
            }
            catch (SocketException e) when (e.SocketErrorCode == SocketError.AddressAlreadyInUse)
            {
                return $"FeederLocate cannot start: port {port} ({url}) is already in use. Stop the other program, or choose another port with --urls http://127.0.0.1:{NextPort(port)} or ASPNETCORE_URLS=http://127.0.0.1:{NextPort(port)}.";
            }
            catch (SocketException e)
            {
                return $"FeederLocate cannot start: it may not listen on port {port} ({url}): {e.Message}.";
            }
        }

        return null;
    }

    private static int NextPort(int port) => port < 65535 ? port + 1 : 5080;

    private static class BindingAddress
    {
        public static bool TryParse(string url, out IPAddress host, out int port)
        {
            host = IPAddress.Loopback;
            port = 0;
            // "*" and "+" stand for every address; Uri does not take them as host names.
            var normalised = url.Replace("://*", "://0.0.0.0", StringComparison.Ordinal).Replace("://+", "://0.0.0.0", StringComparison.Ordinal);
            if (!Uri.TryCreate(normalised, UriKind.Absolute, out var uri) || uri.Scheme is not ("http" or "https"))
            {
                return false;
            }

            port = uri.Port;
            if (uri.Host is "localhost")
            {
                return true;
            }

            if (!IPAddress.TryParse(uri.Host.Trim('[', ']'), out var parsed))
            {
                return false;
            }

            host = parsed;
            return true;
        }
    }
}
