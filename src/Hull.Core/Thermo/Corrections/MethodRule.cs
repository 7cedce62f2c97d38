using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Corrections;

/// <summary>
/// How the entries of one computational method are brought onto the base method's energy scale: a stated shift
/// per atom, or a reference compound computed with both methods whose per-atom energies are made equal (the
/// shift is then the base method's lowest energy per atom of that compound minus this method's). Exactly one of
/// the two.
/// </summary>
public sealed record MethodRule
{
    private MethodRule(string method, double? shiftEvPerAtom, Composition? referenceCompound)
    {
        Method = method;
        ShiftEvPerAtom = shiftEvPerAtom;
        ReferenceCompound = referenceCompound;
    }

    /// <summary>The method tag of the entries the rule moves.</summary>
    public string Method { get; }

    /// <summary>The stated shift per atom (eV), or null for an alignment.</summary>
    public double? ShiftEvPerAtom { get; }

    /// <summary>The compound that aligns this method with the base method, or null for a stated shift.</summary>
    public Composition? ReferenceCompound { get; }

    /// <exception cref="ThermoInputException">A blank method or a non-finite shift.</exception>
    public static MethodRule Shift(string method, double shiftEvPerAtom)
    {
        CheckMethod(method);
        if (!double.IsFinite(shiftEvPerAtom))
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture, $"Method rule for '{method}': the shift is not finite ({shiftEvPerAtom} eV/atom)."));
        }

        return new MethodRule(method, shiftEvPerAtom, null);
    }

    /// <exception cref="ThermoInputException">A blank method or a missing compound.</exception>
    public static MethodRule AlignOn(string method, Composition referenceCompound)
    {
        CheckMethod(method);
        if (referenceCompound is null)
        {
            throw new ThermoInputException($"Method rule for '{method}': an alignment needs a reference compound.");
        }

        return new MethodRule(method, null, referenceCompound);
    }

    private static void CheckMethod(string method)
    {
        if (string.IsNullOrWhiteSpace(method))
        {
            throw new ThermoInputException("A method rule needs a non-blank method tag.");
        }
    }
}
