namespace Hull.Core.Windows;

/// <summary>The result of a vertex enumeration: empty, or the vertices of a polytope of a known parameter dimension.</summary>
public sealed class PolytopeVertices
{
    internal PolytopeVertices(IReadOnlyList<int> free, IReadOnlyList<PolytopeVertex> vertices, int parameterDimension)
    {
        FreeCoordinates = free;
        Vertices = vertices;
        ParameterDimension = parameterDimension;
    }

    internal static PolytopeVertices Empty(IReadOnlyList<int> free) => new(free, [], free.Count);

    /// <summary>True when no point satisfies every constraint.</summary>
    public bool IsEmpty => Vertices.Count == 0;

    /// <summary>
    /// The coordinates left free after the equalities were eliminated, ascending: the projection on these
    /// coordinates is one-to-one, so sizes "as a projection" are measured on them.
    /// </summary>
    public IReadOnlyList<int> FreeCoordinates { get; }

    /// <summary>Dimension of the affine subspace the equalities leave (the polytope's own dimension may be lower).</summary>
    public int ParameterDimension { get; }

    /// <summary>The vertices, in the order the enumeration left them (callers sort for display).</summary>
    public IReadOnlyList<PolytopeVertex> Vertices { get; }
}
