namespace Hull.Core.Chemistry;

/// <summary>
/// Elements whose compounds or elemental forms are well-known laboratory hazards, for the short cautions answers add
/// when a dopant, precursor or limiting phase contains one. Not a safety data sheet: a reminder to look one up.
/// </summary>
public static class ElementHazards
{
    // common practice: the classic toxic dopants and contaminants, the alkali metals (pyrophoric, water-reactive),
    // the halogen gases, and the common actinides.
    private static readonly Dictionary<string, string> Hazards = new(StringComparer.Ordinal)
    {
        ["As"] = "toxic (arsenic and its compounds; arsine gas is acutely toxic)",
        ["Be"] = "toxic (beryllium dust and compounds; a carcinogen)",
        ["Cd"] = "toxic (cadmium and its compounds; a carcinogen)",
        ["Hg"] = "toxic (mercury vapour and compounds)",
        ["Pb"] = "toxic (lead and its compounds)",
        ["Tl"] = "toxic (thallium and its compounds)",
        ["Se"] = "toxic (selenium compounds; hydrogen selenide gas)",
        ["Sb"] = "toxic (antimony compounds; stibine gas)",
        ["Li"] = "water-reactive (lithium metal)",
        ["Na"] = "water-reactive (sodium metal)",
        ["K"] = "pyrophoric and water-reactive (potassium metal)",
        ["Rb"] = "pyrophoric and water-reactive (rubidium metal)",
        ["Cs"] = "pyrophoric and water-reactive (caesium metal)",
        ["F"] = "toxic and corrosive (fluorine gas, hydrogen fluoride)",
        ["Cl"] = "toxic and corrosive (chlorine gas)",
        ["Th"] = "radioactive",
        ["U"] = "radioactive and toxic",
    };

    /// <summary>The hazard of an element, or null when none is listed.</summary>
    public static string? Of(string symbol) => Hazards.GetValueOrDefault(symbol);

    /// <summary>
    /// One caution per listed element among the keys (ordinal order), naming what contains it
    /// (<paramref name="containedIn"/>: element → e.g. "the dopant", "the limiting phase LiMn2O4").
    /// </summary>
    public static IReadOnlyList<string> Cautions(IReadOnlyDictionary<string, string> containedIn) =>
        [.. containedIn.Keys.Order(StringComparer.Ordinal)
            .Where(e => Hazards.ContainsKey(e))
            .Select(e => $"Caution: {containedIn[e]} contains {e}, {Hazards[e]}. Follow local safety rules and licensed practice when preparing or handling it.")];
}
