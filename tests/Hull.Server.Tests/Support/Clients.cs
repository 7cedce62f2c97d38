using Grpc.Core;
using Grpc.Net.Client;
using Hull.Protos.V1;

namespace Hull.Server.Tests.Support;

/// <summary>gRPC clients of one server over a real HTTP/2 connection, optionally sending a bearer token.</summary>
public sealed class Clients : IDisposable
{
    private readonly string? _token;

    public Clients(Uri address, string? token = null, HttpMessageHandler? handler = null)
    {
        _token = token;
        Channel = GrpcChannel.ForAddress(address, new GrpcChannelOptions
        {
            MaxReceiveMessageSize = 64 * 1024 * 1024,
            HttpHandler = handler ?? new SocketsHttpHandler { EnableMultipleHttp2Connections = true },
        });
        Datasets = new DatasetService.DatasetServiceClient(Channel);
        Stability = new StabilityService.StabilityServiceClient(Channel);
        Figures = new FigureService.FigureServiceClient(Channel);
        Diagnostics = new DiagnosticsService.DiagnosticsServiceClient(Channel);
        Windows = new WindowService.WindowServiceClient(Channel);
        Defects = new DefectService.DefectServiceClient(Channel);
        Uncertainty = new UncertaintyService.UncertaintyServiceClient(Channel);
        Corrections = new CorrectionService.CorrectionServiceClient(Channel);
        Curation = new CurationService.CurationServiceClient(Channel);
    }

    public GrpcChannel Channel { get; }

    public DatasetService.DatasetServiceClient Datasets { get; }

    public StabilityService.StabilityServiceClient Stability { get; }

    public FigureService.FigureServiceClient Figures { get; }

    public DiagnosticsService.DiagnosticsServiceClient Diagnostics { get; }

    public WindowService.WindowServiceClient Windows { get; }

    public DefectService.DefectServiceClient Defects { get; }

    public UncertaintyService.UncertaintyServiceClient Uncertainty { get; }

    public CorrectionService.CorrectionServiceClient Corrections { get; }
    public CurationService.CurationServiceClient Curation { get; }

    /// <summary>Call options with the token (when set) and a deadline generous for a loaded CI machine.</summary>
    public CallOptions Call(TimeSpan? timeout = null) =>
        new(_token is null ? null : new Metadata { { "authorization", "Bearer " + _token } }, DateTime.UtcNow + (timeout ?? TimeSpan.FromSeconds(60)));

    public void Dispose() => Channel.Dispose();
}
