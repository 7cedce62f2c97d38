namespace Hull.Core.Figures;

/// <summary>
/// A regular tetrahedron with one corner up, turned about the vertical by the azimuth, tilted towards the viewer
/// by the elevation, and projected orthographically onto the screen (x right, y up, depth away from the viewer).
/// </summary>
internal sealed class TetrahedronView
{
    // Unit-length corners: apex up, the base an equilateral triangle at z = -1/3 (common practice).
    private static readonly double[][] Corners =
    [
        [0, 0, 1],
        [Math.Sqrt(8.0 / 9.0), 0, -1.0 / 3.0],
        [-Math.Sqrt(2.0 / 9.0), Math.Sqrt(2.0 / 3.0), -1.0 / 3.0],
        [-Math.Sqrt(2.0 / 9.0), -Math.Sqrt(2.0 / 3.0), -1.0 / 3.0],
    ];

    private readonly double _cosA, _sinA, _cosE, _sinE;

    public TetrahedronView(double azimuthDegrees, double elevationDegrees)
    {
        double a = azimuthDegrees * Math.PI / 180, e = elevationDegrees * Math.PI / 180;
        (_cosA, _sinA, _cosE, _sinE) = (Math.Cos(a), Math.Sin(a), Math.Cos(e), Math.Sin(e));
    }

    /// <summary>Screen position (each within -1..1, the tetrahedron's circumscribed unit sphere) and depth.</summary>
    public (double U, double V, double Depth) Project(IReadOnlyList<double> fractions)
    {
        double x = 0, y = 0, z = 0;
        for (int k = 0; k < 4; k++)
        {
            x += fractions[k] * Corners[k][0];
            y += fractions[k] * Corners[k][1];
            z += fractions[k] * Corners[k][2];
        }

        // Turn about z, then tilt about x; the viewer looks along +y.
        double x1 = x * _cosA - y * _sinA, y1 = x * _sinA + y * _cosA;
        double y2 = y1 * _cosE - z * _sinE, z2 = y1 * _sinE + z * _cosE;
        return (x1, z2, y2);
    }
}
