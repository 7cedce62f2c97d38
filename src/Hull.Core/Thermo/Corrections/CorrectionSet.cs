namespace Hull.Core.Thermo.Corrections;

/// <summary>
/// A named, versioned set of energy corrections applied to a dataset's entries before hulling: fitted elemental
/// references, species shifts and method rules. Entries tagged with <see cref="BaseMethod"/>, or with no method
/// tag, are on the base scale; every other method needs a rule. Immutable; validated on construction.
/// </summary>
public sealed class CorrectionSet
{
    /// <exception cref="ThermoInputException">A blank name or base method, a version below 1, an element given
    /// two fitted references, an element and class given two shifts, or a method given two rules or a rule for
    /// the base method.</exception>
    public CorrectionSet(
        string name,
        long version,
        string baseMethod,
        IReadOnlyList<FittedElementReference> fittedReferences,
        IReadOnlyList<SpeciesShift> speciesShifts,
        IReadOnlyList<MethodRule> methodRules)
    {
        if (string.IsNullOrWhiteSpace(name)) throw new ThermoInputException("A correction set needs a non-blank name.");
        if (version < 1) throw new ThermoInputException($"Correction set '{name}': versions count from 1, got {version}.");
        if (string.IsNullOrWhiteSpace(baseMethod)) throw new ThermoInputException($"Correction set '{name}': the base method is blank.");
        ArgumentNullException.ThrowIfNull(fittedReferences);
        ArgumentNullException.ThrowIfNull(speciesShifts);
        ArgumentNullException.ThrowIfNull(methodRules);

        string? twice = fittedReferences.GroupBy(r => r.Symbol, StringComparer.Ordinal).FirstOrDefault(g => g.Count() > 1)?.Key;
        if (twice is not null)
        {
            throw new ThermoInputException($"Correction set '{name}': element {twice} has two fitted references.", element: twice);
        }

        var shiftTwice = speciesShifts.GroupBy(s => (s.Symbol, s.Kind)).FirstOrDefault(g => g.Count() > 1)?.Key;
        if (shiftTwice is { } key)
        {
            throw new ThermoInputException(
                $"Correction set '{name}': element {key.Symbol} has two shifts for class {SpeciesClassTokens.Of(key.Kind)}.", element: key.Symbol);
        }

        string? ruleTwice = methodRules.GroupBy(r => r.Method, StringComparer.Ordinal).FirstOrDefault(g => g.Count() > 1)?.Key;
        if (ruleTwice is not null)
        {
            throw new ThermoInputException($"Correction set '{name}': method '{ruleTwice}' has two rules.");
        }

        if (methodRules.Any(r => string.Equals(r.Method, baseMethod, StringComparison.Ordinal)))
        {
            throw new ThermoInputException($"Correction set '{name}': method '{baseMethod}' is the base method and takes no rule.");
        }

        Name = name;
        Version = version;
        BaseMethod = baseMethod;
        FittedReferences = [.. fittedReferences];
        SpeciesShifts = [.. speciesShifts];
        MethodRules = [.. methodRules];
    }

    public string Name { get; }

    public long Version { get; }

    /// <summary>The method whose energy scale the others are brought onto; untagged entries count as it.</summary>
    public string BaseMethod { get; }

    public IReadOnlyList<FittedElementReference> FittedReferences { get; }

    public IReadOnlyList<SpeciesShift> SpeciesShifts { get; }

    public IReadOnlyList<MethodRule> MethodRules { get; }

    /// <summary>True when the set changes nothing: no references, shifts or rules.</summary>
    public bool IsEmpty => FittedReferences.Count == 0 && SpeciesShifts.Count == 0 && MethodRules.Count == 0;

    /// <summary>"name v3", as answers name the set.</summary>
    public string Label => $"{Name} v{Version}";
}
