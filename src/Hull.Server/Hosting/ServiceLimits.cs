namespace Hull.Server.Hosting;

/// <summary>
/// The work limits the server enforces; a request past one gets RESOURCE_EXHAUSTED naming the limit and its value.
/// Each default is a documented number; a deployment may change them with options.
/// </summary>
public sealed record ServiceLimits
{
    /// <summary>
    /// Most elements in one chemical system whose hull a request may need. The hull lives in a simplex of one
    /// dimension less; facet counts grow steeply with dimension, and real screening rarely goes past 6 elements.
    /// </summary>
    public const int DefaultMaxComponentsPerSystem = 8;

    /// <summary>
    /// Most entries one chemical system's hull may be built from. 50,000 points in a few dimensions build in
    /// seconds and stay within a few hundred MB; more belongs to an offline job, not a request.
    /// </summary>
    public const int DefaultMaxEntriesPerSystem = 50_000;

    /// <summary>Most entry ids, formulas or candidates in one request: bounds one request's work to about a second.</summary>
    public const int DefaultMaxCompositionsPerRequest = 1_000;

    /// <summary>
    /// Largest request message, bytes (16 MiB): a 10,000-row import batch is about 1 MB, so this leaves ample room
    /// while bounding the memory one request can claim.
    /// </summary>
    public const int DefaultMaxReceiveMessageBytes = 16 * 1024 * 1024;

    /// <summary>Largest response message, bytes (64 MiB); bulk results are streamed in pages well below it.</summary>
    public const int DefaultMaxSendMessageBytes = 64 * 1024 * 1024;

    /// <summary>The defaults above.</summary>
    public static ServiceLimits Default { get; } = new();

    public int MaxComponentsPerSystem { get; init; } = DefaultMaxComponentsPerSystem;

    public int MaxEntriesPerSystem { get; init; } = DefaultMaxEntriesPerSystem;

    public int MaxCompositionsPerRequest { get; init; } = DefaultMaxCompositionsPerRequest;

    public int MaxReceiveMessageBytes { get; init; } = DefaultMaxReceiveMessageBytes;

    public int MaxSendMessageBytes { get; init; } = DefaultMaxSendMessageBytes;
}
