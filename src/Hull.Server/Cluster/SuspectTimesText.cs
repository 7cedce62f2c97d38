using System.Globalization;

namespace Hull.Server.Cluster;

/// <summary>
/// The members that suspect a member, with when each did, as one text column: "address=time" pairs joined by '|'
/// (a member's address text holds neither character; times are UTC round-trip text).
/// </summary>
internal static class SuspectTimesText
{
    public static string Format(List<Tuple<SiloAddress, DateTime>>? suspects) =>
        suspects is null ? string.Empty
            : string.Join('|', suspects.Select(s => s.Item1.ToParsableString() + "=" + s.Item2.ToUniversalTime().ToString("O", CultureInfo.InvariantCulture)));

    public static List<Tuple<SiloAddress, DateTime>> Parse(string text) =>
        text.Length == 0 ? []
            : [.. text.Split('|').Select(pair =>
            {
                int equals = pair.LastIndexOf('=');
                return Tuple.Create(SiloAddress.FromParsableString(pair[..equals]),
                    DateTime.Parse(pair[(equals + 1)..], CultureInfo.InvariantCulture, DateTimeStyles.RoundtripKind));
            })];
}
