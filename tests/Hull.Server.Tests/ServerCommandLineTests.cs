using System.Net;
using Hull.Server.Hosting;

namespace Hull.Server.Tests;

/// <summary>The server's options: defaults, values, and errors that name the option.</summary>
public sealed class ServerCommandLineTests
{
    [Fact]
    public void Defaults_bind_loopback_on_the_documented_port()
    {
        HullServerOptions? options = ServerCommandLine.Parse(["--data-dir", "/tmp/x"], out string? error, out bool help);
        Assert.Null(error);
        Assert.False(help);
        Assert.Equal(IPAddress.Loopback, options!.BindAddress);
        Assert.Equal(HullServerOptions.DefaultPort, options.Port);
        Assert.Equal(ServiceLimits.Default, options.Limits);
        Assert.Equal(HullServerOptions.DefaultWarmBeforeReady, options.WarmBeforeReady);
        Assert.Equal(TimeSpan.Zero, new HullServerOptions { DataDirectory = "/tmp/x" }.WarmBeforeReady);
    }

    [Fact]
    public void Reads_every_option()
    {
        HullServerOptions? options = ServerCommandLine.Parse(
            ["--data-dir=/d", "--host", "::1", "--port", "0", "--tls-cert", "c.pem", "--tls-key", "k.pem", "--write-token", "tok",
             "--max-components-per-system", "5", "--max-entries-per-system", "100", "--max-compositions-per-request", "7",
             "--max-message-bytes", "65536", "--log-level", "warning", "--warm-before-ready", "3"], out string? error, out _);
        Assert.Null(error);
        Assert.Equal("/d", options!.DataDirectory);
        Assert.Equal(IPAddress.IPv6Loopback, options.BindAddress);
        Assert.Equal((0, "c.pem", "k.pem", "tok"), (options.Port, options.TlsCertificatePath, options.TlsKeyPath, options.WriteToken));
        Assert.Equal(TimeSpan.FromSeconds(3), options.WarmBeforeReady);
        Assert.Equal((5, 100, 7, 65536), (options.Limits.MaxComponentsPerSystem, options.Limits.MaxEntriesPerSystem, options.Limits.MaxCompositionsPerRequest, options.Limits.MaxReceiveMessageBytes));
    }

    [Theory]
    [InlineData(new[] { "--prot", "1" }, "unknown option '--prot'")]
    [InlineData(new[] { "--port" }, "option --port needs a value")]
    [InlineData(new[] { "--port", "70000" }, "--port 70000 is outside 0..65535")]
    [InlineData(new[] { "--port", "x" }, "--port 'x' is not a whole number")]
    [InlineData(new[] { "--host", "example" }, "--host 'example' is not an IP address")]
    [InlineData(new[] { "--max-entries-per-system", "0" }, "--max-entries-per-system must be at least 1")]
    [InlineData(new[] { "--log-level", "loud" }, "--log-level 'loud' is not one of")]
    [InlineData(new[] { "--warm-before-ready", "-1" }, "--warm-before-ready must be 0 or more seconds")]
    [InlineData(new[] { "--data-dir", "/d", "--postgres", "Host=db" }, "give --data-dir or --postgres, not both")]
    [InlineData(new[] { "--postgres", "Host=db;Colour=blue" }, "--postgres: the PostgreSQL connection string cannot be read")]
    [InlineData(new[] { "--postgres", "Database=hull" }, "--postgres: the PostgreSQL connection string names no Host")]
    [InlineData(new[] { "--data-dir", "/d", "--cluster", "c" }, "--cluster needs --postgres: the members of a cluster share one store")]
    [InlineData(new[] { "--postgres", "Host=db", "--peer-port", "1" }, "--peer-port needs --cluster")]
    [InlineData(new[] { "--postgres", "Host=db", "--cluster", "c", "--peer-port", "0" }, "--peer-port 0 is outside 1..65535")]
    [InlineData(new[] { "--postgres", "Host=db", "--cluster", "c", "--peer-port", "7", "--gateway-port", "7" }, "--peer-port and --gateway-port are both 7")]
    [InlineData(new[] { "--postgres", "Host=db", "--cluster", "c", "--peer-host", "0.0.0.0" }, "--peer-host 0.0.0.0 is not an address others can reach")]
    [InlineData(new[] { "--postgres", "Host=db", "--cluster", "c", "--cluster-postgres", "Database=m" }, "--cluster-postgres: the PostgreSQL connection string names no Host")]
    public void Bad_options_are_named(string[] args, string expected)
    {
        Assert.Null(ServerCommandLine.Parse(args, out string? error, out _));
        Assert.Contains(expected, error);
    }

    [Fact]
    public void A_postgres_connection_selects_the_shared_store_and_is_described_without_its_password()
    {
        HullServerOptions? options = ServerCommandLine.Parse(["--postgres", "Host=db.example;Database=hull;Username=u;Password=secret"], out string? error, out _);
        Assert.Null(error);
        Assert.Equal("Host=db.example;Database=hull;Username=u;Password=secret", options!.PostgresConnectionString);
        Assert.Equal("postgresql://u@db.example:5432/hull", options.StoreDescription);
        Assert.Null(ServerCommandLine.Parse(["--data-dir", "/d"], out _, out _)!.PostgresConnectionString);
    }

    [Fact]
    public void Cluster_options_name_the_cluster_its_ports_and_the_membership_database()
    {
        HullServerOptions? alone = ServerCommandLine.Parse(["--postgres", "Host=db"], out _, out _);
        Assert.Null(alone!.Cluster);

        HullServerOptions? defaults = ServerCommandLine.Parse(["--postgres", "Host=db", "--cluster", "c", "--host", "0.0.0.0"], out string? error, out _);
        Assert.Null(error);
        Assert.Equal(("c", ServerCommandLine.DefaultPeerPort, ServerCommandLine.DefaultGatewayPort, "Host=db", IPAddress.Loopback),
            (defaults!.Cluster!.ClusterName, defaults.Cluster.PeerPort, defaults.Cluster.GatewayPort, defaults.Cluster.MembershipConnectionString, defaults.Cluster.PeerAddress));

        HullServerOptions? given = ServerCommandLine.Parse(
            ["--postgres", "Host=db", "--cluster", "c", "--peer-port", "7001", "--gateway-port", "7101", "--peer-host", "10.0.0.5",
             "--cluster-postgres", "Host=members"], out error, out _);
        Assert.Null(error);
        Assert.Equal((7001, 7101, "Host=members", IPAddress.Parse("10.0.0.5")),
            (given!.Cluster!.PeerPort, given.Cluster.GatewayPort, given.Cluster.MembershipConnectionString, given.Cluster.PeerAddress));
    }
}
