using System.CommandLine;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// `--end-members A,B,C`: a hull over compound end-members instead of elements. Each item is a formula, or
/// `entry:ID` for the composition of a stored entry.
/// </summary>
public static class EndMemberOption
{
    public const string EntryPrefix = "entry:";

    public static Option<string?> Create() => new("--end-members")
    {
        Description = "hull over compound end-members instead of elements: formulas joined by ',' (e.g. LiCoO2,LiNiO2,LiMnO2); " +
                      $"write {EntryPrefix}ID for a stored entry's composition",
    };

    /// <summary>The end-members of the option's text, in order; empty when it is not given.</summary>
    /// <exception cref="UsageException">An empty item.</exception>
    public static IReadOnlyList<EndMember> Parse(string? text)
    {
        if (text is null) return [];
        var members = new List<EndMember>();
        string[] items = text.Split(',');
        for (int i = 0; i < items.Length; i++)
        {
            string item = items[i].Trim();
            if (item.Length == 0 || item == EntryPrefix)
            {
                throw new UsageException($"--end-members: item {i + 1} of '{text}' is empty; write formulas (or {EntryPrefix}ID) joined by ','");
            }

            members.Add(item.StartsWith(EntryPrefix, StringComparison.Ordinal)
                ? new EndMember { EntryId = item[EntryPrefix.Length..] }
                : new EndMember { Formula = item });
        }

        return members;
    }
}
