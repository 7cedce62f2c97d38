namespace Hull.Core.Figures;

/// <summary>The figure drawn for a hull of 2, 3 or 4 components.</summary>
public enum FigureKind
{
    Binary = 2,
    Ternary = 3,
    Quaternary = 4,
}
