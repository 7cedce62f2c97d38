namespace Hull.Core.Optimization;

/// <summary>
/// The first defect found in a linear program, naming the row and column it is in (-1 where it is not about a
/// row or a column); <see cref="Message"/> says it in words.
/// </summary>
public sealed record ModelIssue(ModelIssueKind Kind, int Row, int Column, string Message)
{
    public override string ToString() => Message;
}
