using System.Net;
using System.Security.Cryptography;
using System.Security.Cryptography.X509Certificates;
using Hull.Server.Hosting;
using Microsoft.Extensions.Logging;

namespace Hull.Cli.Tests;

/// <summary>
/// `--ca-file`: a server on TLS with a self-signed certificate is reached only when the client is given that
/// certificate (or its authority); the server's name is still checked, and a bad file is an input error.
/// </summary>
public sealed class CaFileTests : IAsyncLifetime
{
    private string _folder = null!;
    private HullServer _server = null!;
    private string _serverCertificate = null!;

    private string Https => $"https://127.0.0.1:{_server.Port}";

    public async Task InitializeAsync()
    {
        _folder = Path.Combine(Path.GetTempPath(), "hull-cli-tls-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(_folder);
        _serverCertificate = WriteSelfSigned("server", loopbackName: true, out string keyPath);
        _server = await HullServer.StartAsync(new HullServerOptions
        {
            DataDirectory = Path.Combine(_folder, "data"),
            Port = 0,
            TlsCertificatePath = _serverCertificate,
            TlsKeyPath = keyPath,
            MinimumLogLevel = LogLevel.Warning,
        });
    }

    public async Task DisposeAsync()
    {
        await _server.StopAsync();
        Directory.Delete(_folder, recursive: true);
    }

    /// <summary>A self-signed certificate as PEM (and its key), valid for 127.0.0.1 or only for another name.</summary>
    private string WriteSelfSigned(string name, bool loopbackName, out string keyPath)
    {
        using RSA key = RSA.Create(2048);
        var request = new CertificateRequest($"CN={name}", key, HashAlgorithmName.SHA256, RSASignaturePadding.Pkcs1);
        var san = new SubjectAlternativeNameBuilder();
        if (loopbackName) san.AddIpAddress(IPAddress.Loopback);
        else san.AddDnsName("other.invalid");
        request.CertificateExtensions.Add(san.Build());
        using X509Certificate2 certificate = request.CreateSelfSigned(DateTimeOffset.UtcNow.AddMinutes(-5), DateTimeOffset.UtcNow.AddDays(1));
        string certificatePath = Path.Combine(_folder, name + ".crt");
        keyPath = Path.Combine(_folder, name + ".key");
        File.WriteAllText(certificatePath, certificate.ExportCertificatePem());
        File.WriteAllText(keyPath, key.ExportPkcs8PrivateKeyPem());
        return certificatePath;
    }

    [Fact]
    public async Task The_servers_own_certificate_lets_the_client_in()
    {
        var untrusted = await CliRun.RunAsync("datasets", "list", "--server", Https);
        Assert.Equal(ExitCodes.ServerUnreachable, untrusted.ExitCode);
        Assert.Contains("does not trust", untrusted.Err);
        Assert.Contains("--ca-file", untrusted.Err);

        var created = await CliRun.RunAsync("datasets", "create", "tls-demo", "--server", Https, "--ca-file", _serverCertificate);
        Assert.True(created.ExitCode == 0, created.Err);
        var listed = await CliRun.RunAsync("datasets", "list", "--server", Https, "--ca-file", _serverCertificate, "--csv");
        Assert.True(listed.ExitCode == 0, listed.Err);
        Assert.Contains("tls-demo", listed.Out);
    }

    [Fact]
    public async Task Another_certificate_or_another_name_is_refused()
    {
        string stranger = WriteSelfSigned("stranger", loopbackName: true, out _);
        var wrongAuthority = await CliRun.RunAsync("datasets", "list", "--server", Https, "--ca-file", stranger);
        Assert.Equal(ExitCodes.ServerUnreachable, wrongAuthority.ExitCode);
        Assert.Contains("does not trust", wrongAuthority.Err);

        // The same key pair's trust does not cover a certificate issued for another name: a server presenting a
        // certificate for other.invalid at 127.0.0.1 is refused even when that certificate is the trusted one.
        string otherName = WriteSelfSigned("elsewhere", loopbackName: false, out string otherKey);
        var elsewhere = await HullServer.StartAsync(new HullServerOptions
        {
            DataDirectory = Path.Combine(_folder, "data-elsewhere"),
            Port = 0,
            TlsCertificatePath = otherName,
            TlsKeyPath = otherKey,
            MinimumLogLevel = LogLevel.Warning,
        });
        try
        {
            var mismatch = await CliRun.RunAsync("datasets", "list", "--server", $"https://127.0.0.1:{elsewhere.Port}", "--ca-file", otherName);
            Assert.Equal(ExitCodes.ServerUnreachable, mismatch.ExitCode);
        }
        finally
        {
            await elsewhere.StopAsync();
        }
    }

    [Fact]
    public async Task Bad_ca_files_and_plain_http_are_refused_before_any_call()
    {
        string missing = Path.Combine(_folder, "missing.pem");
        var absent = await CliRun.RunAsync("datasets", "list", "--server", Https, "--ca-file", missing);
        Assert.Equal(ExitCodes.InputFile, absent.ExitCode);
        Assert.Contains(missing, absent.Err);

        var blank = await CliRun.RunAsync("datasets", "list", "--server", Https, "--ca-file", "");
        Assert.Equal(ExitCodes.InputFile, blank.ExitCode);
        Assert.Contains("cannot read the certificate file", blank.Err);

        string empty = Path.Combine(_folder, "empty.pem");
        await File.WriteAllTextAsync(empty, "not a certificate\n");
        var noCertificate = await CliRun.RunAsync("datasets", "list", "--server", Https, "--ca-file", empty);
        Assert.Equal(ExitCodes.InputFile, noCertificate.ExitCode);
        Assert.Contains("no PEM certificate", noCertificate.Err);

        var plain = await CliRun.RunAsync("datasets", "list", "--server", $"http://127.0.0.1:{_server.Port}", "--ca-file", _serverCertificate);
        Assert.Equal(ExitCodes.Usage, plain.ExitCode);
        Assert.Contains("--ca-file applies to https://", plain.Err);
    }
}
