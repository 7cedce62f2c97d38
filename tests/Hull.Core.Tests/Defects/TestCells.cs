using Hull.Core.Defects;

namespace Hull.Core.Tests.Defects;

/// <summary>Arbitrary cells and tensors for identity and reference checks (inputs only; no expected values here).</summary>
internal static class TestCells
{
    /// <summary>A skewed triclinic cell of ~700 Å³, angles far from 90°.</summary>
    public static LatticeCell Triclinic() => LatticeCell.Create(new(9.1, 0.0, 0.0), new(2.3, 8.4, 0.0), new(-1.7, 1.9, 9.6));

    /// <summary>A symmetric positive-definite tensor with off-diagonal coupling (eigenvalues ~5–13).</summary>
    public static DielectricTensor FullTensor() => DielectricTensor.FromMatrix(Matrix3.FromRows([[9.0, 1.5, -0.8], [1.5, 6.5, 2.1], [-0.8, 2.1, 11.2]]));

    public static Matrix3 Rotation(double ax, double ay, double az)
    {
        var rx = Matrix3.FromRows([[1, 0, 0], [0, Math.Cos(ax), -Math.Sin(ax)], [0, Math.Sin(ax), Math.Cos(ax)]]);
        var ry = Matrix3.FromRows([[Math.Cos(ay), 0, Math.Sin(ay)], [0, 1, 0], [-Math.Sin(ay), 0, Math.Cos(ay)]]);
        var rz = Matrix3.FromRows([[Math.Cos(az), -Math.Sin(az), 0], [Math.Sin(az), Math.Cos(az), 0], [0, 0, 1]]);
        return rz * ry * rx;
    }
}
