namespace Hull.Core.Figures;

/// <summary>Where a figure's data came from; written into the SVG's metadata and footer.</summary>
/// <param name="Dataset">Dataset name.</param>
/// <param name="Version">Dataset version the hull was built from.</param>
/// <param name="ContentSha256">The version's content fingerprint (hex).</param>
/// <param name="Corrections">The correction set the version's energies were corrected with, as answers name it
/// ("fit v1 from version 3"); null for energies imported as given. A figure travels without its answer, so it says so itself.</param>
public sealed record FigureMetadata(string Dataset, long Version, string ContentSha256, string? Corrections = null)
{
    /// <summary>The source as attributes of a figure's metadata element (escaped), the same in every figure kind.</summary>
    internal string SvgAttributes() =>
        $"dataset=\"{SvgText.Escape(Dataset)}\" version=\"{Version}\" content-sha256=\"{SvgText.Escape(ContentSha256)}\"" +
        (Corrections is null ? string.Empty : $" corrections=\"{SvgText.Escape(Corrections)}\"");
}
