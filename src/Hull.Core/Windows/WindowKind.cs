namespace Hull.Core.Windows;

/// <summary>What kind of answer a stability window is.</summary>
public enum WindowKind
{
    /// <summary>A hull vertex (or a polymorph tied with one): a window of dimension N − 1.</summary>
    Full,

    /// <summary>On the hull inside a face of it: a window of dimension N − 1 − k, k the face's dimension.</summary>
    LowerDimensional,

    /// <summary>Within the tolerance asked for and treated as lowered to δ below the hull: a full window.</summary>
    Lowered,

    /// <summary>Above the hull: no window.</summary>
    AboveHull,
}
