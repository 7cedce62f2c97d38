using Hull.Server.Caching;

namespace Hull.Server.Cluster;

/// <summary>The grain key of one chemical system's hull: dataset, version, fingerprint, system and references key.</summary>
public static class SystemHullKey
{
    private const char Separator = '\n';

    public static string Of(VersionRef version, string system, string references) =>
        string.Join(Separator, version.Dataset, version.Version.ToString(System.Globalization.CultureInfo.InvariantCulture),
            version.Fingerprint, system, references);

    /// <summary>The chemical system ("Co-Li-O") named by a key made with <see cref="Of"/>.</summary>
    public static string SystemOf(string key) => key.Split(Separator)[3];

    /// <summary>The version named by a key made with <see cref="Of"/>.</summary>
    public static VersionRef VersionOf(string key)
    {
        string[] parts = key.Split(Separator);
        return new VersionRef(parts[0], long.Parse(parts[1], System.Globalization.CultureInfo.InvariantCulture), parts[2]);
    }
}
