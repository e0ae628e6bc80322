using System.Net;
using System.Net.Sockets;
using FeederLocate.Web.Hosting;

namespace FeederLocate.Web.Tests.Deployment;

public class ListenAddressesTests
{
    [Fact]
    public void A_busy_port_gives_one_line_naming_the_port_and_how_to_choose_another()
    {
        var holder = new TcpListener(IPAddress.Loopback, 0);
        holder.Start();
        try
        {
            var port = ((IPEndPoint)holder.LocalEndpoint).Port;

            var problem = ListenAddresses.Problem([$"http://127.0.0.1:{port}"]);

            Assert.NotNull(problem);
            Assert.DoesNotContain('\n', problem);
            Assert.Contains($"port {port}", problem, StringComparison.Ordinal);
            Assert.Contains("--urls", problem, StringComparison.Ordinal);
            Assert.Contains("ASPNETCORE_URLS", problem, StringComparison.Ordinal);
        }
        finally
        {
            holder.Stop();
        }
    }

    [Fact]
    public void A_free_port_and_port_zero_are_no_problem()
    {
        var probe = new TcpListener(IPAddress.Loopback, 0);
        probe.Start();
        var port = ((IPEndPoint)probe.LocalEndpoint).Port;
        probe.Stop();

        Assert.Null(ListenAddresses.Problem([$"http://127.0.0.1:{port}", "http://127.0.0.1:0"]));
    }

    [Fact]
    public void Something_that_is_no_address_is_named()
    {
        var problem = ListenAddresses.Problem(["ftp://somewhere:21"]);

        Assert.NotNull(problem);
        Assert.Contains("ftp://somewhere:21", problem, StringComparison.Ordinal);
    }

    [Fact]
    public void The_command_line_wins_over_the_default()
    {
        Assert.Equal(["http://127.0.0.1:6001", "http://127.0.0.1:6002"], ListenAddresses.For(["--urls", "http://127.0.0.1:6001;http://127.0.0.1:6002"]));
    }
}
