using System.Security.Cryptography;
using System.Security.Cryptography.X509Certificates;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>The write token (UNAUTHENTICATED / PERMISSION_DENIED) and serving over TLS.</summary>
public sealed class WriteTokenAndTlsTests
{
    [Fact]
    public async Task Writes_need_the_token_reads_do_not()
    {
        await using var s = await RunningServer.StartAsync(o => o with { WriteToken = "s3cret-token" });
        using var anonymous = new Clients(s.Server.Address);
        using var wrong = new Clients(s.Server.Address, "not-the-token");

        var missing = await Assert.ThrowsAsync<RpcException>(async () =>
            await anonymous.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "d" }, anonymous.Call()));
        Assert.Equal(StatusCode.Unauthenticated, missing.StatusCode);
        Assert.Contains("Bearer", missing.Status.Detail);

        var denied = await Assert.ThrowsAsync<RpcException>(async () =>
            await wrong.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "d" }, wrong.Call()));
        Assert.Equal(StatusCode.PermissionDenied, denied.StatusCode);

        await Data.CreateWithAsync(s.Clients, "d", Data.LiCoO());
        foreach (var call in new Func<Task>[]
                 {
                     async () => await wrong.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, Data.Formation("x", "Li2O2", -1)), wrong.Call()),
                     async () => await wrong.Datasets.DeleteVersionAsync(new DeleteVersionRequest { Dataset = "d", Version = 1 }, wrong.Call()),
                     async () => await wrong.Datasets.DeleteDatasetAsync(new DeleteDatasetRequest { Name = "d" }, wrong.Call()),
                     async () => await wrong.Defects.ImportDefectStudyAsync(new ImportDefectStudyRequest { Dataset = "d", StudyName = "s", StudyJson = "{}" }, wrong.Call()),
                 })
        {
            Assert.Equal(StatusCode.PermissionDenied, (await Assert.ThrowsAsync<RpcException>(call)).StatusCode);
        }

        // Reads are open, and nothing above changed the dataset.
        var listed = await anonymous.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "d" }, anonymous.Call());
        Assert.Equal(1, listed.Dataset.LatestVersion);
        var energies = await anonymous.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "d", Formulas = { "LiCoO2" } }, anonymous.Call());
        Assert.Equal(-1.8, energies.Results[0].HullEnergyEvPerAtom, 12);
    }

    [Fact]
    public async Task Serves_over_tls_with_a_pem_certificate()
    {
        using var folder = new TempFolder();
        using RSA key = RSA.Create(2048);
        var request = new CertificateRequest("CN=localhost", key, HashAlgorithmName.SHA256, RSASignaturePadding.Pkcs1);
        var san = new SubjectAlternativeNameBuilder();
        san.AddIpAddress(System.Net.IPAddress.Loopback);
        request.CertificateExtensions.Add(san.Build());
        using X509Certificate2 certificate = request.CreateSelfSigned(DateTimeOffset.UtcNow.AddMinutes(-5), DateTimeOffset.UtcNow.AddDays(1));
        string certPath = Path.Combine(folder.Path, "server.crt");
        string keyPath = Path.Combine(folder.Path, "server.key");
        await File.WriteAllTextAsync(certPath, certificate.ExportCertificatePem());
        await File.WriteAllTextAsync(keyPath, key.ExportPkcs8PrivateKeyPem());

        await using var s = await RunningServer.StartAsync(o => o with { TlsCertificatePath = certPath, TlsKeyPath = keyPath });
        Assert.Equal("https", s.Server.Address.Scheme);
        var handler = new SocketsHttpHandler
        {
            SslOptions = { RemoteCertificateValidationCallback = (_, presented, _, _) => presented is not null && presented.GetCertHashString() == certificate.GetCertHashString() },
        };
        using var clients = new Clients(s.Server.Address, handler: handler);
        var created = await clients.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "tls" }, clients.Call());
        Assert.Equal("tls", created.Name);

        // A plain-text client cannot talk to the TLS port.
        using var plain = new Clients(new Uri($"http://127.0.0.1:{s.Server.Port}"));
        var e = await Assert.ThrowsAsync<RpcException>(async () =>
            await plain.Datasets.ListDatasetsAsync(new ListDatasetsRequest(), plain.Call(TimeSpan.FromSeconds(10))));
        Assert.NotEqual(StatusCode.OK, e.StatusCode);
    }
    [Fact]
    public async Task The_standalone_server_names_an_unusable_tls_file_and_exits_2_instead_of_crashing()
    {
        using var folder = new TempFolder();
        using RSA key = RSA.Create(2048), otherKey = RSA.Create(2048);
        var request = new CertificateRequest("CN=localhost", key, HashAlgorithmName.SHA256, RSASignaturePadding.Pkcs1);
        using X509Certificate2 certificate = request.CreateSelfSigned(DateTimeOffset.UtcNow.AddMinutes(-5), DateTimeOffset.UtcNow.AddDays(1));
        string File(string name, string text)
        {
            string path = Path.Combine(folder.Path, name);
            System.IO.File.WriteAllText(path, text);
            return path;
        }

        string certOnly = File("cert-only.pem", certificate.ExportCertificatePem());
        string garbage = File("garbage.pem", "not a certificate\n");
        string garbagePkcs12 = File("garbage.pfx", "not a certificate either\n");
        string wrongKey = File("other.key", otherKey.ExportPkcs8PrivateKeyPem());
        string data = Path.Combine(folder.Path, "data");
        var cases = new (string[] Args, string Expected)[]
        {
            (["--tls-cert", Path.Combine(folder.Path, "none.pem")], $"--tls-cert '{Path.Combine(folder.Path, "none.pem")}': no such file"),
            (["--tls-cert", certOnly, "--tls-key", Path.Combine(folder.Path, "none.key")], "--tls-key '" + Path.Combine(folder.Path, "none.key") + "': no such file"),
            (["--tls-cert", garbage], $"--tls-cert '{garbage}' is not a usable PEM file"),
            (["--tls-cert", certOnly], $"--tls-cert '{certOnly}' is not a usable PEM file holding a certificate and its private key"),
            (["--tls-cert", garbagePkcs12], $"--tls-cert '{garbagePkcs12}' is not a usable PKCS#12 file"),
            (["--tls-cert", certOnly, "--tls-key", garbage], $"--tls-cert '{certOnly}' with --tls-key '{garbage}' is not a usable PEM certificate and private key"),
            (["--tls-cert", certOnly, "--tls-key", wrongKey], $"--tls-cert '{certOnly}' with --tls-key '{wrongKey}' is not a usable PEM certificate and private key"),
            (["--tls-key", wrongKey], $"--tls-key '{wrongKey}' needs --tls-cert as well"),
        };

        foreach ((string[] args, string expected) in cases)
        {
            (int exitCode, string output, string error) = await ChildServer.RunToExitAsync(data, args);
            string context = $"{string.Join(' ', args)}: exit {exitCode}, stderr {error}";
            Assert.True(exitCode == 2, context);
            Assert.Contains("hull-server: " + expected, error);
            Assert.DoesNotContain("Unhandled exception", error);
            Assert.DoesNotContain("listening", output);
        }
    }
}
