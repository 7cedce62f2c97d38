namespace Hull.Core.Figures;

/// <summary>Where a figure's data came from; written into the SVG's metadata and footer.</summary>
/// <param name="Dataset">Dataset name.</param>
/// <param name="Version">Dataset version the hull was built from.</param>
/// <param name="ContentSha256">The version's content fingerprint (hex).</param>
public sealed record FigureMetadata(string Dataset, long Version, string ContentSha256);
