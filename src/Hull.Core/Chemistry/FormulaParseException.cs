namespace Hull.Core.Chemistry;

/// <summary>
/// A chemical formula that could not be read. <see cref="Position"/> is the 0-based character index of the
/// problem in <see cref="Formula"/>; the message counts characters from 1 for people
/// ("unknown element 'Xx' at character 3 in 'LiXx2'" has Position 2).
/// </summary>
public sealed class FormulaParseException : FormatException
{
    /// <summary>Creates the error; the message is built from the parts.</summary>
    /// <param name="formula">The whole text that was parsed.</param>
    /// <param name="position">0-based index of the offending character (Formula.Length for "at the end").</param>
    /// <param name="problem">What is wrong, e.g. "unknown element 'Xx'".</param>
    public FormulaParseException(string formula, int position, string problem)
        : base(BuildMessage(formula, position, problem))
    {
        Formula = formula;
        Position = position;
        Problem = problem;
    }

    /// <summary>The whole text that was parsed.</summary>
    public string Formula { get; }

    /// <summary>0-based character index of the problem; equals Formula.Length when the text ended too early.</summary>
    public int Position { get; }

    /// <summary>What is wrong, without the location (e.g. "unknown element 'Xx'").</summary>
    public string Problem { get; }

    private static string BuildMessage(string formula, int position, string problem)
    {
        string where = position >= formula.Length
            ? $"at the end (character {position + 1})"
            : $"at character {position + 1}";
        return $"{problem} {where} in '{formula}'";
    }
}
