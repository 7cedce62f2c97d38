using Hull.Core.Figures;
using Hull.Server.Caching;

namespace Hull.Server.Mapping;

/// <summary>A figure's provenance from the version it was drawn from, naming the correction set when the version has one.</summary>
public static class FigureSource
{
    public static FigureMetadata Of(VersionRef version) => new(version.Dataset, version.Version, version.Fingerprint,
        version.Corrections is { } c ? $"{c.Label} from version {c.SourceVersion}" : null);
}
