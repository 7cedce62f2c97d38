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
}
