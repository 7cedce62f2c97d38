namespace Hull.Core.Defects;

/// <summary>
/// The potential offset ΔV = ⟨V_def − V_bulk − V_model⟩ over the far-field region (V, electrostatic sign), and
/// how well defined it is.
/// </summary>
/// <param name="Method">Where it came from.</param>
/// <param name="ShiftVolts">ΔV.</param>
/// <param name="SpreadVolts">Spread of V_def − V_bulk − V_model over the region: the largest max − min within a
/// plateau window (or between axes) for planar averages, the standard deviation over the sites for site
/// potentials; 0 when given outright.</param>
/// <param name="PointsUsed">Grid points or sites averaged.</param>
/// <param name="AxisShiftsVolts">ΔV per axis for planar averages (axis → ΔV), empty otherwise.</param>
/// <param name="SamplingRadiusAngstrom">Radius of the excluded sphere for site potentials, else 0.</param>
/// <param name="SignCorrelation">Correlation of V_def − V_bulk with V_model over every supplied point: close to +1
/// when the sign convention is right, negative when the potentials have the other sign; NaN when not defined.</param>
/// <param name="Warnings">Doubts about the input, in words.</param>
public sealed record AlignmentResult(
    AlignmentMethod Method,
    double ShiftVolts,
    double SpreadVolts,
    int PointsUsed,
    IReadOnlyDictionary<int, double> AxisShiftsVolts,
    double SamplingRadiusAngstrom,
    double SignCorrelation,
    IReadOnlyList<string> Warnings);
