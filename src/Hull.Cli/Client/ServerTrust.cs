using System.Net.Security;
using System.Security.Cryptography;
using System.Security.Cryptography.X509Certificates;
using Hull.Cli.Input;

namespace Hull.Cli.Client;

/// <summary>
/// Certificates the client trusts for an https:// server besides the system's: a private certificate authority, or
/// a server's self-signed certificate, read from a PEM file (--ca-file). The server's name is still checked.
/// </summary>
public sealed class ServerTrust
{
    private readonly X509Certificate2Collection _anchors;

    private ServerTrust(X509Certificate2Collection anchors) => _anchors = anchors;

    /// <summary>The certificates in a PEM file (one or more "BEGIN CERTIFICATE" blocks).</summary>
    /// <exception cref="InputFileException">The file is missing or unreadable, or holds no certificate.</exception>
    public static ServerTrust Load(string path)
    {
        var anchors = new X509Certificate2Collection();
        try
        {
            anchors.ImportFromPemFile(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException)
        {
            throw new InputFileException(path, null, $"cannot read the certificate file: {e.Message}", e);
        }
        catch (CryptographicException e)
        {
            throw new InputFileException(path, null, $"not a PEM certificate file: {e.Message}", e);
        }
        if (anchors.Count == 0) throw new InputFileException(path, null, "holds no PEM certificate (-----BEGIN CERTIFICATE-----)");
        return new ServerTrust(anchors);
    }

    /// <summary>
    /// Accepts what the system trusts; otherwise a certificate whose only fault is an untrusted chain, when the chain
    /// ends at one of these certificates. A wrong server name or a missing certificate is never accepted.
    /// </summary>
    public bool Validate(X509Certificate? presented, X509Chain? systemChain, SslPolicyErrors errors)
    {
        if (errors == SslPolicyErrors.None) return true;
        if (presented is null || errors != SslPolicyErrors.RemoteCertificateChainErrors) return false;
        using var chain = new X509Chain();
        chain.ChainPolicy.TrustMode = X509ChainTrustMode.CustomRootTrust;
        chain.ChainPolicy.CustomTrustStore.AddRange(_anchors);
        // Private authorities seldom publish revocation lists; the anchors are trusted by the user's explicit choice.
        chain.ChainPolicy.RevocationMode = X509RevocationMode.NoCheck;
        if (systemChain is not null)
        {
            foreach (X509ChainElement element in systemChain.ChainElements) chain.ChainPolicy.ExtraStore.Add(element.Certificate);
        }
        using var leaf = new X509Certificate2(presented);
        return chain.Build(leaf);
    }
}
