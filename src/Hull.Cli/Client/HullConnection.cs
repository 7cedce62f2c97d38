using Grpc.Core;
using Grpc.Health.V1;
using Grpc.Net.Client;
using Hull.Protos.V1;

namespace Hull.Cli.Client;

/// <summary>One channel to a hull server, its service clients, and the call options every call uses.</summary>
public sealed class HullConnection : IDisposable
{
    /// <summary>Largest response accepted, bytes: the server's default send limit.</summary>
    private const int MaxReceiveMessageBytes = 64 * 1024 * 1024;

    /// <summary>How long to wait for a TCP connection before calling the server unreachable.</summary>
    private static readonly TimeSpan ConnectTimeout = TimeSpan.FromSeconds(5);

    private readonly GrpcChannel _channel;
    private readonly string? _token;
    private readonly TimeSpan _timeout;

    /// <param name="address">The server, http:// or https://.</param>
    /// <param name="token">Bearer token sent with every call, or null.</param>
    /// <param name="timeout">Deadline of each call.</param>
    /// <param name="trust">Certificates trusted for an https:// server besides the system's, or null.</param>
    public HullConnection(Uri address, string? token, TimeSpan timeout, ServerTrust? trust = null)
    {
        Address = address;
        _token = token;
        _timeout = timeout;
        var handler = new SocketsHttpHandler { ConnectTimeout = ConnectTimeout, EnableMultipleHttp2Connections = true };
        if (trust is not null) handler.SslOptions.RemoteCertificateValidationCallback = (_, certificate, chain, errors) => trust.Validate(certificate, chain, errors);
        _channel = GrpcChannel.ForAddress(address, new GrpcChannelOptions
        {
            MaxReceiveMessageSize = MaxReceiveMessageBytes,
            HttpHandler = handler,
        });
        Datasets = new DatasetService.DatasetServiceClient(_channel);
        Stability = new StabilityService.StabilityServiceClient(_channel);
        Diagnostics = new DiagnosticsService.DiagnosticsServiceClient(_channel);
        Windows = new WindowService.WindowServiceClient(_channel);
        Uncertainty = new UncertaintyService.UncertaintyServiceClient(_channel);
        Electrochemistry = new ElectrochemistryService.ElectrochemistryServiceClient(_channel);
        Thermo = new ThermoService.ThermoServiceClient(_channel);
        Health = new Health.HealthClient(_channel);
        Figures = new FigureService.FigureServiceClient(_channel);
        Defects = new DefectService.DefectServiceClient(_channel);
        Corrections = new CorrectionService.CorrectionServiceClient(_channel);
        Curation = new CurationService.CurationServiceClient(_channel);
    }

    public Uri Address { get; }

    public DatasetService.DatasetServiceClient Datasets { get; }

    public StabilityService.StabilityServiceClient Stability { get; }

    public DiagnosticsService.DiagnosticsServiceClient Diagnostics { get; }

    public WindowService.WindowServiceClient Windows { get; }

    public UncertaintyService.UncertaintyServiceClient Uncertainty { get; }

    public CorrectionService.CorrectionServiceClient Corrections { get; }

    public ElectrochemistryService.ElectrochemistryServiceClient Electrochemistry { get; }

    public ThermoService.ThermoServiceClient Thermo { get; }

    public Health.HealthClient Health { get; }

    public FigureService.FigureServiceClient Figures { get; }

    public DefectService.DefectServiceClient Defects { get; }

    public CurationService.CurationServiceClient Curation { get; }

    /// <summary>Options for one call: the bearer token when given, the deadline, and cancellation.</summary>
    public CallOptions Call(CancellationToken cancellation)
    {
        Metadata? headers = _token is null ? null : new Metadata { { "authorization", "Bearer " + _token } };
        return new CallOptions(headers, DateTime.UtcNow + _timeout, cancellation);
    }

    public void Dispose() => _channel.Dispose();
}
