using Hull.Protos.V1;

namespace Hull.Cli.Output;

/// <summary>
/// Warnings on stderr when an answer comes from a thinly covered chemical system: an element without any entry
/// (its corner is formation energy 0 by definition) or a system without competing phases. Such an answer says how a
/// composition sits against what the dataset holds, not whether it is stable against what exists.
/// </summary>
public static class CoverageWarnings
{
    /// <summary>Systems warned about one by one; beyond that a count, so a large analysis stays readable.</summary>
    private const int MaxSystemsNamed = 10;

    /// <param name="error">Where warnings go.</param>
    /// <param name="coverage">The answer's coverage, one per hull system.</param>
    /// <param name="storedEntries">True when the answer is about stored entries, which count among the system's
    /// compounds themselves; a candidate does not.</param>
    public static void Write(TextWriter error, IEnumerable<SystemCoverage> coverage, bool storedEntries)
    {
        // A stored compound is one of its system's compounds, so a lone one has nothing to compete with.
        int fewest = storedEntries ? 1 : 0;
        var lines = new List<string>();
        foreach (SystemCoverage system in coverage)
        {
            string[] missing = system.Elements.Where(e => e.ZeroByDefinition).Select(e => e.Symbol).ToArray();
            if (missing.Length > 0)
            {
                lines.Add($"warning: {system.ChemicalSystem}: the dataset has no entry of {string.Join(", ", missing)}; "
                          + $"{(missing.Length == 1 ? "its" : "their")} formation energy is set to 0 by definition and no computed phase of "
                          + $"{(missing.Length == 1 ? "it" : "them")} was compared");
            }

            if (system.CompetingPhaseCount <= fewest)
            {
                lines.Add($"warning: {system.ChemicalSystem}: no competing phase (no other compound entry); the answer only compares with the elements");
            }
        }

        foreach (string line in lines.Take(MaxSystemsNamed)) error.WriteLine(line);
        if (lines.Count > MaxSystemsNamed) error.WriteLine($"warning: {lines.Count - MaxSystemsNamed} more coverage warnings (see the coverage field of --json)");
    }

    /// <summary>One line per system that could not be analysed.</summary>
    public static void Write(TextWriter error, IEnumerable<SystemProblem> problems)
    {
        foreach (SystemProblem problem in problems)
        {
            string ids = string.Join(", ", problem.UnansweredEntryIds.Take(MaxSystemsNamed));
            string more = problem.UnansweredEntryCount > MaxSystemsNamed ? $" and {problem.UnansweredEntryCount - MaxSystemsNamed} more" : string.Empty;
            error.WriteLine($"warning: {problem.Message} Without a result: {ids}{more}.");
        }
    }
}
