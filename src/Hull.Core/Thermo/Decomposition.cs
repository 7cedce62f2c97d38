using System.Globalization;
using System.Text;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// Where a composition falls on the hull: the hull energy there and the hull phases it splits into, both as atom
/// fractions (lever rule) and as a balanced reaction from one formula unit of the composition as written.
/// </summary>
public sealed class Decomposition
{
    internal Decomposition(Composition composition, HullAxis axis, double hullEnergyEvPerAtom, IReadOnlyList<DecompositionProduct> products)
    {
        Composition = composition;
        Axis = axis;
        HullEnergyEvPerAtom = hullEnergyEvPerAtom;
        Products = products;
    }

    /// <summary>The composition that decomposes (as written: the reaction is per one formula unit of it).</summary>
    public Composition Composition { get; }

    /// <summary>The hull's energy axis.</summary>
    public HullAxis Axis { get; }

    /// <summary>
    /// The hull's energy at this composition, on its axis (<see cref="HullAxis.Unit"/>; on the closed hull, the
    /// formation energy in eV/atom). On an open-element hull the reaction balances the closed elements only.
    /// </summary>
    public double HullEnergyEvPerAtom { get; }

    /// <summary>The hull phases, sorted by id; a composition on a hull vertex has that one vertex.</summary>
    public IReadOnlyList<DecompositionProduct> Products { get; }

    /// <summary>True when every coefficient is an exact fraction (the reaction was balanced in exact arithmetic).</summary>
    public bool IsExact => Products.All(p => p.ExactFormulaUnits is not null);

    /// <summary>The reaction, e.g. "FeO -> 1/4 Fe + 1/4 Fe3O4" (exact fractions where known).</summary>
    public string ToReactionString()
    {
        var text = new StringBuilder(Composition.Formula).Append(" -> ");
        for (int i = 0; i < Products.Count; i++)
        {
            DecompositionProduct product = Products[i];
            if (i > 0)
            {
                text.Append(" + ");
            }

            string coefficient = product.ExactFormulaUnits is { } exact
                ? exact.ToString()
                : product.FormulaUnits.ToString("G6", CultureInfo.InvariantCulture);
            if (coefficient != "1")
            {
                text.Append(coefficient).Append(' ');
            }

            text.Append(product.Phase.IsSynthetic ? product.Phase.Id : product.Phase.Composition.Formula);
        }

        return text.ToString();
    }

    public override string ToString() => ToReactionString();
}
