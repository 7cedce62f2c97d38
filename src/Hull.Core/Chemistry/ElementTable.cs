using System.Diagnostics.CodeAnalysis;

namespace Hull.Core.Chemistry;

/// <summary>
/// The 118 elements with their symbols, names and conventional standard atomic weights.
/// </summary>
/// <remarks>
/// Weights: IUPAC CIAAW Standard Atomic Weights (2021), abridged values to five significant figures, with the
/// conventional value for elements whose standard atomic weight is an interval (H, Li, B, C, N, O, Mg, Si, S,
/// Cl, Ar, Br, Tl, Pb) — from memory. Null where CIAAW gives no standard atomic weight (Tc, Pm, Po to Ac,
/// Np onward); Th, Pa and U have one.
/// Symbol look-up is case-sensitive on purpose: "co" is not "Co", and "CO" is two elements.
/// </remarks>
public static class ElementTable
{
    private static readonly Element[] ByNumber =
    [
        new("H", 1, "Hydrogen", 1.008),
        new("He", 2, "Helium", 4.0026),
        new("Li", 3, "Lithium", 6.94),
        new("Be", 4, "Beryllium", 9.0122),
        new("B", 5, "Boron", 10.81),
        new("C", 6, "Carbon", 12.011),
        new("N", 7, "Nitrogen", 14.007),
        new("O", 8, "Oxygen", 15.999),
        new("F", 9, "Fluorine", 18.998),
        new("Ne", 10, "Neon", 20.180),
        new("Na", 11, "Sodium", 22.990),
        new("Mg", 12, "Magnesium", 24.305),
        new("Al", 13, "Aluminium", 26.982),
        new("Si", 14, "Silicon", 28.085),
        new("P", 15, "Phosphorus", 30.974),
        new("S", 16, "Sulfur", 32.06),
        new("Cl", 17, "Chlorine", 35.45),
        new("Ar", 18, "Argon", 39.95),
        new("K", 19, "Potassium", 39.098),
        new("Ca", 20, "Calcium", 40.078),
        new("Sc", 21, "Scandium", 44.956),
        new("Ti", 22, "Titanium", 47.867),
        new("V", 23, "Vanadium", 50.942),
        new("Cr", 24, "Chromium", 51.996),
        new("Mn", 25, "Manganese", 54.938),
        new("Fe", 26, "Iron", 55.845),
        new("Co", 27, "Cobalt", 58.933),
        new("Ni", 28, "Nickel", 58.693),
        new("Cu", 29, "Copper", 63.546),
        new("Zn", 30, "Zinc", 65.38),
        new("Ga", 31, "Gallium", 69.723),
        new("Ge", 32, "Germanium", 72.630),
        new("As", 33, "Arsenic", 74.922),
        new("Se", 34, "Selenium", 78.971),
        new("Br", 35, "Bromine", 79.904),
        new("Kr", 36, "Krypton", 83.798),
        new("Rb", 37, "Rubidium", 85.468),
        new("Sr", 38, "Strontium", 87.62),
        new("Y", 39, "Yttrium", 88.906),
        new("Zr", 40, "Zirconium", 91.224),
        new("Nb", 41, "Niobium", 92.906),
        new("Mo", 42, "Molybdenum", 95.95),
        new("Tc", 43, "Technetium", null),
        new("Ru", 44, "Ruthenium", 101.07),
        new("Rh", 45, "Rhodium", 102.91),
        new("Pd", 46, "Palladium", 106.42),
        new("Ag", 47, "Silver", 107.87),
        new("Cd", 48, "Cadmium", 112.41),
        new("In", 49, "Indium", 114.82),
        new("Sn", 50, "Tin", 118.71),
        new("Sb", 51, "Antimony", 121.76),
        new("Te", 52, "Tellurium", 127.60),
        new("I", 53, "Iodine", 126.90),
        new("Xe", 54, "Xenon", 131.29),
        new("Cs", 55, "Caesium", 132.91),
        new("Ba", 56, "Barium", 137.33),
        new("La", 57, "Lanthanum", 138.91),
        new("Ce", 58, "Cerium", 140.12),
        new("Pr", 59, "Praseodymium", 140.91),
        new("Nd", 60, "Neodymium", 144.24),
        new("Pm", 61, "Promethium", null),
        new("Sm", 62, "Samarium", 150.36),
        new("Eu", 63, "Europium", 151.96),
        new("Gd", 64, "Gadolinium", 157.25),
        new("Tb", 65, "Terbium", 158.93),
        new("Dy", 66, "Dysprosium", 162.50),
        new("Ho", 67, "Holmium", 164.93),
        new("Er", 68, "Erbium", 167.26),
        new("Tm", 69, "Thulium", 168.93),
        new("Yb", 70, "Ytterbium", 173.05),
        new("Lu", 71, "Lutetium", 174.97),
        new("Hf", 72, "Hafnium", 178.49),
        new("Ta", 73, "Tantalum", 180.95),
        new("W", 74, "Tungsten", 183.84),
        new("Re", 75, "Rhenium", 186.21),
        new("Os", 76, "Osmium", 190.23),
        new("Ir", 77, "Iridium", 192.22),
        new("Pt", 78, "Platinum", 195.08),
        new("Au", 79, "Gold", 196.97),
        new("Hg", 80, "Mercury", 200.59),
        new("Tl", 81, "Thallium", 204.38),
        new("Pb", 82, "Lead", 207.2),
        new("Bi", 83, "Bismuth", 208.98),
        new("Po", 84, "Polonium", null),
        new("At", 85, "Astatine", null),
        new("Rn", 86, "Radon", null),
        new("Fr", 87, "Francium", null),
        new("Ra", 88, "Radium", null),
        new("Ac", 89, "Actinium", null),
        new("Th", 90, "Thorium", 232.04),
        new("Pa", 91, "Protactinium", 231.04),
        new("U", 92, "Uranium", 238.03),
        new("Np", 93, "Neptunium", null),
        new("Pu", 94, "Plutonium", null),
        new("Am", 95, "Americium", null),
        new("Cm", 96, "Curium", null),
        new("Bk", 97, "Berkelium", null),
        new("Cf", 98, "Californium", null),
        new("Es", 99, "Einsteinium", null),
        new("Fm", 100, "Fermium", null),
        new("Md", 101, "Mendelevium", null),
        new("No", 102, "Nobelium", null),
        new("Lr", 103, "Lawrencium", null),
        new("Rf", 104, "Rutherfordium", null),
        new("Db", 105, "Dubnium", null),
        new("Sg", 106, "Seaborgium", null),
        new("Bh", 107, "Bohrium", null),
        new("Hs", 108, "Hassium", null),
        new("Mt", 109, "Meitnerium", null),
        new("Ds", 110, "Darmstadtium", null),
        new("Rg", 111, "Roentgenium", null),
        new("Cn", 112, "Copernicium", null),
        new("Nh", 113, "Nihonium", null),
        new("Fl", 114, "Flerovium", null),
        new("Mc", 115, "Moscovium", null),
        new("Lv", 116, "Livermorium", null),
        new("Ts", 117, "Tennessine", null),
        new("Og", 118, "Oganesson", null),
    ];

    private static readonly Dictionary<string, Element> BySymbolMap =
        ByNumber.ToDictionary(e => e.Symbol, StringComparer.Ordinal);

    /// <summary>All elements in order of atomic number (index = Z - 1).</summary>
    public static IReadOnlyList<Element> All { get; } = Array.AsReadOnly(ByNumber);

    /// <summary>The element with this exact (case-sensitive) symbol.</summary>
    /// <exception cref="ArgumentException">When no element has this symbol; the message names it.</exception>
    public static Element BySymbol(string symbol)
    {
        ArgumentNullException.ThrowIfNull(symbol);
        if (!BySymbolMap.TryGetValue(symbol, out Element? element))
        {
            throw new ArgumentException($"Unknown element symbol '{symbol}' (symbols are case-sensitive, e.g. 'Co').", nameof(symbol));
        }

        return element;
    }

    /// <summary>Looks up an exact (case-sensitive) symbol; false when unknown or null.</summary>
    public static bool TryGetBySymbol([NotNullWhen(true)] string? symbol, [NotNullWhen(true)] out Element? element)
    {
        if (symbol is null)
        {
            element = null;
            return false;
        }

        return BySymbolMap.TryGetValue(symbol, out element);
    }

    /// <summary>True when <paramref name="symbol"/> is the exact symbol of an element.</summary>
    public static bool IsSymbol([NotNullWhen(true)] string? symbol) => symbol is not null && BySymbolMap.ContainsKey(symbol);

    /// <summary>The element with atomic number <paramref name="atomicNumber"/> (1 to 118).</summary>
    /// <exception cref="ArgumentOutOfRangeException">Outside 1 to 118.</exception>
    public static Element ByAtomicNumber(int atomicNumber)
    {
        if (atomicNumber < 1 || atomicNumber > ByNumber.Length)
        {
            throw new ArgumentOutOfRangeException(
                nameof(atomicNumber), atomicNumber, $"Atomic number {atomicNumber} is outside 1 to {ByNumber.Length}.");
        }

        return ByNumber[atomicNumber - 1];
    }
}
