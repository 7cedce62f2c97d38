namespace Hull.Core.Defects;

/// <summary>
/// The potential alignment ΔV of a charged defect's supercell: the far-field average of V_def − V_bulk − V_model,
/// from planar averages (Freysoldt–Neugebauer–Van de Walle) or atomic-site potentials (Kumagai–Oba), with V_model
/// the potential of the same model charge that gives the image-charge energy. The correction adds −qΔV.
/// </summary>
/// <remarks>
/// Sign convention: potentials are electrostatic, in volts (a unit positive charge's energy), so V_def − V_bulk
/// rises towards a positive defect like V_model does. Potentials declared as electron potential energies are
/// negated first. The correlation of V_def − V_bulk with V_model over every supplied point checks the declaration:
/// a clearly negative correlation is refused.
/// </remarks>
public static class PotentialAlignment
{
    /// <summary>
    /// Default width of the planar plateau window: the middle quarter of the axis opposite the defect, far enough
    /// from the defect (≥ 3/8 of the axis) that its short-range potential has died out in a typical 3–4 nm cell.
    /// </summary>
    public const double DefaultPlateauWidthFraction = 0.25;

    /// <summary>
    /// A correlation below −0.5 between V_def − V_bulk and V_model means the potentials have the other sign from
    /// the one declared: the model potential dominates the difference near a charged defect, so a right sign gives
    /// a clearly positive value.
    /// </summary>
    public const double SignCorrelationRefusal = -0.5;

    /// <summary>ΔV from planar averages.</summary>
    public static AlignmentResult FromPlanarAverages(LatticeCell cell, DielectricTensor dielectric, ModelCharge model, int charge,
        Vector3D defectFractional, AlignmentInput.PlanarAverages input, string field = "alignment")
    {
        if (input.Profiles.Count == 0) throw new DefectInputException($"{field}.profiles", "at least one planar profile is needed");
        double width = input.PlateauWidthFraction ?? DefaultPlateauWidthFraction;
        if (!(width > 0 && width < 1)) throw new DefectInputException($"{field}.plateau_width_fraction", $"the plateau width must lie in (0, 1), not {width}");

        var axisShifts = new SortedDictionary<int, double>();
        var warnings = new List<string>();
        var allDifference = new List<double>();
        var allModel = new List<double>();
        double spread = 0;
        int used = 0;
        for (int p = 0; p < input.Profiles.Count; p++)
        {
            var profile = input.Profiles[p];
            string where = $"{field}.profiles[{p}]";
            if (profile.Axis is < 0 or > 2) throw new DefectInputException($"{where}.axis", $"axis must be 0, 1 or 2, not {profile.Axis}");
            if (axisShifts.ContainsKey(profile.Axis)) throw new DefectInputException($"{where}.axis", $"axis {profile.Axis} is given twice");
            int n = profile.DefectCell.Count;
            if (n < 4) throw new DefectInputException($"{where}.defect_cell", $"a planar profile needs at least 4 points, not {n}");
            if (profile.BulkCell.Count != n)
            {
                throw new DefectInputException($"{where}.bulk_cell", $"the bulk profile has {profile.BulkCell.Count} points and the defect profile {n}: they must share one grid");
            }

            double[] modelPotential = ModelPotential.PlanarAverage(cell, dielectric, model, charge, defectFractional[profile.Axis], profile.Axis, n);
            double centre = defectFractional[profile.Axis] + 0.5;
            var window = new List<double>();
            for (int k = 0; k < n; k++)
            {
                double vDef = profile.DefectCell[k], vBulk = profile.BulkCell[k];
                if (!double.IsFinite(vDef) || !double.IsFinite(vBulk)) throw new DefectInputException($"{where}[{k}]", "potentials must be finite numbers");
                double difference = input.Sign.ToElectrostatic(vDef) - input.Sign.ToElectrostatic(vBulk);
                allDifference.Add(difference);
                allModel.Add(modelPotential[k]);
                double offset = (double)k / n - centre;
                offset -= Math.Round(offset);
                // A point sitting exactly on the window's edge belongs to it; rounding of k/n must not decide that.
                if (Math.Abs(offset) <= 0.5 * width + 1e-12) window.Add(difference - modelPotential[k]);
            }

            if (window.Count == 0)
            {
                throw new DefectInputException($"{field}.plateau_width_fraction", $"the plateau window of width {width} holds no point of the {n}-point grid on axis {profile.Axis}");
            }

            axisShifts[profile.Axis] = window.Average();
            spread = Math.Max(spread, window.Max() - window.Min());
            used += window.Count;
        }

        double shift = axisShifts.Values.Average();
        if (axisShifts.Count > 1) spread = Math.Max(spread, axisShifts.Values.Max() - axisShifts.Values.Min());
        double correlation = CheckSign(allDifference, allModel, charge, input.Sign, field);
        return new AlignmentResult(AlignmentMethod.PlanarAverage, shift, spread, used, axisShifts, 0, correlation, warnings);
    }

    /// <summary>ΔV from atomic-site potentials outside the sphere inscribed in the defect-centred Wigner–Seitz cell.</summary>
    public static AlignmentResult FromAtomicSites(LatticeCell cell, DielectricTensor dielectric, ModelCharge model, int charge,
        Vector3D defectFractional, AlignmentInput.AtomicSites input, EwaldSettings? settings = null, string field = "alignment")
    {
        if (input.Sites.Count == 0) throw new DefectInputException($"{field}.sites", "at least one site potential is needed");
        // The inscribed sphere of the Wigner–Seitz cell touches its nearest face: half the shortest lattice vector.
        double radius = 0.5 * cell.ShortestVectorLength();
        var positions = new Vector3D[input.Sites.Count];
        for (int s = 0; s < positions.Length; s++)
        {
            var site = input.Sites[s];
            if (!site.Fractional.IsFinite || !double.IsFinite(site.DefectCell) || !double.IsFinite(site.BulkCell))
            {
                throw new DefectInputException($"{field}.sites[{s}]", "site positions and potentials must be finite numbers");
            }

            positions[s] = site.Fractional;
        }

        double[] modelPotential = ModelPotential.AtSites(cell, dielectric, model, charge, defectFractional, positions, settings);
        var difference = new double[positions.Length];
        var sampled = new List<double>();
        for (int s = 0; s < positions.Length; s++)
        {
            var site = input.Sites[s];
            difference[s] = input.Sign.ToElectrostatic(site.DefectCell) - input.Sign.ToElectrostatic(site.BulkCell);
            if (cell.MinimumImage(defectFractional, site.Fractional).Length > radius) sampled.Add(difference[s] - modelPotential[s]);
        }

        if (sampled.Count == 0)
        {
            throw new DefectInputException($"{field}.sites", $"no site lies outside the sphere of radius {radius:F3} Å around the defect; supply the far sites too");
        }

        double mean = sampled.Average();
        double deviation = Math.Sqrt(sampled.Sum(v => (v - mean) * (v - mean)) / sampled.Count);
        double correlation = CheckSign(difference, modelPotential, charge, input.Sign, field);
        var warnings = new List<string>();
        if (sampled.Count < 3) warnings.Add($"only {sampled.Count} site(s) lie outside the sampling sphere: the alignment rests on very few atoms");
        return new AlignmentResult(AlignmentMethod.AtomicSites, mean, deviation, sampled.Count, new Dictionary<int, double>(), radius, correlation, warnings);
    }

    private static double CheckSign(IReadOnlyList<double> difference, IReadOnlyList<double> model, int charge, PotentialSign sign, string field)
    {
        double correlation = Correlation(difference, model);
        if (charge != 0 && correlation < SignCorrelationRefusal)
        {
            string other = sign == PotentialSign.Electrostatic ? "electron potential energies" : "electrostatic potentials";
            throw new DefectInputException($"{field}.sign",
                $"V_def − V_bulk runs against the model potential (correlation {correlation:F2}): the potentials look like {other}; declare their sign");
        }

        return correlation;
    }

    private static double Correlation(IReadOnlyList<double> x, IReadOnlyList<double> y)
    {
        int n = x.Count;
        if (n < 2) return double.NaN;
        double mx = x.Average(), my = y.Average();
        double sxy = 0, sxx = 0, syy = 0;
        for (int i = 0; i < n; i++)
        {
            sxy += (x[i] - mx) * (y[i] - my);
            sxx += (x[i] - mx) * (x[i] - mx);
            syy += (y[i] - my) * (y[i] - my);
        }

        // A difference that is the model plus a constant (or a flat model) has nothing to correlate beyond rounding.
        return sxx <= 0 || syy <= 0 ? double.NaN : sxy / Math.Sqrt(sxx * syy);
    }
}
