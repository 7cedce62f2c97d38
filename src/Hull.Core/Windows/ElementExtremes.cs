namespace Hull.Core.Windows;

/// <summary>The highest and lowest Δμ of one element over a window, and the vertices where each is reached.</summary>
public sealed class ElementExtremes
{
    internal ElementExtremes(string element, double highestEv, double lowestEv, IReadOnlyList<int> highestAt, IReadOnlyList<int> lowestAt)
    {
        Element = element;
        HighestEv = highestEv;
        LowestEv = lowestEv;
        HighestAtVertices = highestAt;
        LowestAtVertices = lowestAt;
    }

    public string Element { get; }

    /// <summary>Highest Δμ of the element in the window (eV): the element-rich end.</summary>
    public double HighestEv { get; }

    /// <summary>Lowest Δμ (eV): the element-lean end.</summary>
    public double LowestEv { get; }

    /// <summary>Indices of the vertices at the highest value (within the slack tolerance).</summary>
    public IReadOnlyList<int> HighestAtVertices { get; }

    /// <summary>Indices of the vertices at the lowest value.</summary>
    public IReadOnlyList<int> LowestAtVertices { get; }
}
