namespace Hull.Server.Hosting;

/// <summary>
/// The TLS certificate or key file the server was given cannot be used: missing, unreadable, not a certificate, or
/// without its private key. The message names the option, the file and the reason.
/// </summary>
public sealed class TlsFileException(string message, Exception? inner = null) : Exception(message, inner);
