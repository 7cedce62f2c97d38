using System.Text;
using Hull.Server.Errors;

namespace Hull.Server.Services;

/// <summary>
/// The opaque page_token of the List calls: which list it continues (and for ListVersions, which dataset) and the
/// last key handed out. Keys are the list's sort order (dataset names, version numbers), so a page never repeats or
/// skips an item that existed through the whole walk, whatever was created or deleted in between.
/// </summary>
public static class PageToken
{
    /// <summary>Items per page when the request says 0.</summary>
    public const int DefaultPageSize = 100;

    /// <summary>Most items per page; a larger page_size is served as this many.</summary>
    public const int MaxPageSize = 1000;

    private const string Prefix = "p1";

    /// <summary>The page size to serve: 0 is the default, above the maximum is the maximum, negative is refused.</summary>
    public static int PageSize(int requested, string field = "page_size")
    {
        if (requested < 0)
        {
            throw RpcErrors.InvalidArgument(field, $"page size {requested} is negative; give 1..{MaxPageSize}, or 0 for {DefaultPageSize}");
        }

        return requested == 0 ? DefaultPageSize : Math.Min(requested, MaxPageSize);
    }

    /// <summary>
    /// The token that continues after <paramref name="lastKey"/> in <paramref name="list"/>, which names what is
    /// listed including what scopes it (e.g. "versions/cathodes").
    /// </summary>
    public static string Encode(string list, string lastKey) =>
        Convert.ToBase64String(Encoding.UTF8.GetBytes($"{Prefix}\n{list}\n{lastKey}")).TrimEnd('=').Replace('+', '-').Replace('/', '_');

    /// <summary>
    /// The last key handed out, or null for an empty token (the first page). INVALID_ARGUMENT (INVALID_PAGE_TOKEN) for
    /// a token this server did not make for the same list.
    /// </summary>
    public static string? Decode(string token, string list, string field = "page_token")
    {
        if (token.Length == 0) return null;
        string? text = null;
        try
        {
            string base64 = token.Replace('-', '+').Replace('_', '/');
            base64 = base64.PadRight(base64.Length + (4 - base64.Length % 4) % 4, '=');
            text = new UTF8Encoding(false, true).GetString(Convert.FromBase64String(base64));
        }
        catch (Exception e) when (e is FormatException or DecoderFallbackException)
        {
        }

        string[] parts = text?.Split('\n', 3) ?? [];
        if (parts.Length != 3 || parts[0] != Prefix)
        {
            throw RpcErrors.InvalidArgument(field, "the page token is not one this server handed out; send next_page_token unchanged, or empty for the first page",
                ErrorReasons.InvalidPageToken);
        }

        if (!string.Equals(parts[1], list, StringComparison.Ordinal))
        {
            throw RpcErrors.InvalidArgument(field, $"the page token continues another list ({parts[1]}), not {list}; a token only continues the request it came from",
                ErrorReasons.InvalidPageToken);
        }

        return parts[2];
    }
}
