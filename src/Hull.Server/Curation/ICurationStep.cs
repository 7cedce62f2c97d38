using System.Text.Json.Nodes;

namespace Hull.Server.Curation;

/// <summary>
/// One kind of curation step: a pure function of the entries before it and its parameters, so a recorded recipe
/// run again on the same entries gives the same entries. A new kind is one class and one line in <see cref="CurationStepKinds"/>.
/// </summary>
public interface ICurationStep
{
    /// <summary>The step's kind as written in a recipe, e.g. "drop_flagged".</summary>
    string Kind { get; }

    /// <summary>The step's parameters as a recipe writes them (every default filled in).</summary>
    JsonObject Parameters();

    /// <summary>The entries that remain after the step, in the order given; <paramref name="context"/> describes the source version.</summary>
    CurationStepOutcome Apply(IReadOnlyList<CurationEntry> entries, CurationContext context);
}

/// <summary>What one step left, and how many entries it changed in place (0 for steps that only drop).</summary>
/// <param name="Entries">The entries after the step.</param>
/// <param name="Changed">Entries it changed in place.</param>
/// <param name="Context">What later steps know instead, when the step changed the energies' scale; null keeps it.</param>
public sealed record CurationStepOutcome(IReadOnlyList<CurationEntry> Entries, int Changed = 0, CurationContext? Context = null);
