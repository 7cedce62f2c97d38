namespace Hull.Core.Chemistry;

/// <summary>
/// A chemical element.
/// </summary>
/// <param name="Symbol">IUPAC symbol, capitalised as written ("Fe").</param>
/// <param name="AtomicNumber">Z, 1 to 118.</param>
/// <param name="Name">English IUPAC name ("Iron").</param>
/// <param name="StandardAtomicWeight">
/// Conventional standard atomic weight in g/mol (numerically equal to the relative atomic mass Ar);
/// null for elements without a standard atomic weight (no stable isotope with a characteristic terrestrial
/// abundance).
/// </param>
public sealed record Element(string Symbol, int AtomicNumber, string Name, double? StandardAtomicWeight)
{
    /// <inheritdoc />
    public override string ToString() => Symbol;
}
