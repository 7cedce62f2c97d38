using Hull.Core.Defects;
using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Defects;

/// <summary>
/// Potential alignment: the model potentials against an independent NumPy evaluation, and synthetic potentials
/// V_def − V_bulk = V_model + C that must give an alignment term of exactly −qC with E_lat unchanged.
/// </summary>
public sealed class AlignmentTests
{
    // The NumPy reference sums plain reciprocal series (Gaussian) or its own Ewald form (point) to ~1e-12 V.
    private const double ReferenceVolts = 1e-9;

    // ΔV is an average of (V_model + C) − V_model: rounding only.
    private const double ExactVolts = 1e-12;

    private static readonly Vector3D DefectPosition = new(0.21, 0.37, 0.64);

    private static List<Vector3D> Sites(int count, int seed)
    {
        var random = new Random(seed);
        return [.. Enumerable.Range(0, count).Select(_ => new Vector3D(random.NextDouble(), random.NextDouble(), random.NextDouble()))];
    }

    [Fact]
    public void Site_and_planar_model_potentials_agree_with_numpy()
    {
        var cell = TestCells.Triclinic();
        var eps = TestCells.FullTensor();
        var sites = Sites(40, 7);
        var reference = new ElectrostaticsReference();
        int gaussianSites = reference.Sites(cell, eps, ModelCharge.Default, 2, DefectPosition, sites);
        int pointSites = reference.Sites(cell, eps, ModelCharge.Point, -1, DefectPosition, sites);
        int scalarSites = reference.Sites(cell, DielectricTensor.Scalar(8.0), ModelCharge.Gaussian(1.4), 3, DefectPosition, sites);
        int gaussianPlanar = reference.Planar(cell, DielectricTensor.Scalar(8.0), ModelCharge.Default, 2, 0.37, 1, 48);
        int pointPlanar = reference.Planar(cell, DielectricTensor.Scalar(8.0), ModelCharge.Point, -2, 0.64, 2, 50);
        var results = reference.Run();

        // NumPy/SciPy reference, tests/Hull.Core.Tests/References/defect_electrostatics.py (Debian python3-scipy)
        AssertClose(ElectrostaticsReference.Numbers(results[gaussianSites]), ModelPotential.AtSites(cell, eps, ModelCharge.Default, 2, DefectPosition, sites), ReferenceVolts);
        AssertClose(ElectrostaticsReference.Numbers(results[pointSites]), ModelPotential.AtSites(cell, eps, ModelCharge.Point, -1, DefectPosition, sites), ReferenceVolts);
        AssertClose(ElectrostaticsReference.Numbers(results[scalarSites]),
            ModelPotential.AtSites(cell, DielectricTensor.Scalar(8.0), ModelCharge.Gaussian(1.4), 3, DefectPosition, sites), ReferenceVolts);
        AssertClose(ElectrostaticsReference.Numbers(results[gaussianPlanar]),
            ModelPotential.PlanarAverage(cell, DielectricTensor.Scalar(8.0), ModelCharge.Default, 2, 0.37, 1, 48), ReferenceVolts);
        // the point charge's planar sum 1/m² is cut at 400,000 terms in NumPy: a tail below ~2e-6 V here
        AssertClose(ElectrostaticsReference.Numbers(results[pointPlanar]),
            ModelPotential.PlanarAverage(cell, DielectricTensor.Scalar(8.0), ModelCharge.Point, -2, 0.64, 2, 50), 1e-5);
    }

    [Fact]
    public void Site_potentials_do_not_depend_on_the_splitting()
    {
        // common practice: the Ewald split moves work between the sums, never the total
        var cell = TestCells.Triclinic();
        var eps = TestCells.FullTensor();
        var sites = Sites(10, 3);
        double[] reference = ModelPotential.AtSites(cell, eps, ModelCharge.Default, 1, DefectPosition, sites);
        foreach (double gamma in new[] { 0.35, 1.2 })
        {
            AssertClose(reference, ModelPotential.AtSites(cell, eps, ModelCharge.Default, 1, DefectPosition, sites, new EwaldSettings(gamma)), 1e-11);
        }
    }

    [Theory]
    [InlineData(2, 0.137)]
    [InlineData(-3, -0.052)]
    public void Planar_potentials_offset_by_a_constant_give_minus_q_times_the_constant(int charge, double offset)
    {
        var cell = LatticeCell.Create(new(11.0, 0, 0), new(0, 12.0, 0), new(0.8, 0, 13.0));
        var eps = DielectricTensor.Scalar(9.0);
        var model = ModelCharge.Default;
        var profiles = new List<PlanarProfile>();
        for (int axis = 0; axis < 3; axis++)
        {
            int n = 40 + 4 * axis;
            double[] v = ModelPotential.PlanarAverage(cell, eps, model, charge, DefectPosition[axis], axis, n);
            double[] bulk = [.. Enumerable.Range(0, n).Select(k => 3.0 * Math.Sin(2 * Math.PI * k / n * 3) - 5.0)];
            profiles.Add(new PlanarProfile(axis, [.. bulk.Zip(v, (b, m) => b + m + offset)], bulk));
        }

        var bare = FiniteSizeCorrector.Correct(cell, eps, model, charge, DefectPosition, null);
        var aligned = FiniteSizeCorrector.Correct(cell, eps, model, charge, DefectPosition, new AlignmentInput.PlanarAverages(profiles));
        Assert.Equal(bare.ImageChargeEv, aligned.ImageChargeEv);
        Assert.Equal(offset, aligned.Alignment!.ShiftVolts, ExactVolts);
        Assert.Equal(-charge * offset, aligned.AlignmentEv, ExactVolts);
        Assert.True(aligned.Alignment.SpreadVolts < ExactVolts);
        Assert.Equal(aligned.ImageChargeEv - charge * offset, aligned.TotalEv, ExactVolts);
    }

    [Theory]
    [InlineData(1, 0.211)]
    [InlineData(-2, -0.083)]
    public void Site_potentials_offset_by_a_constant_give_minus_q_times_the_constant(int charge, double offset)
    {
        var cell = TestCells.Triclinic();
        var eps = TestCells.FullTensor();
        var model = ModelCharge.Default;
        var positions = Sites(60, 11);
        double[] v = ModelPotential.AtSites(cell, eps, model, charge, DefectPosition, positions);
        var random = new Random(5);
        var sites = positions.Select((p, i) =>
        {
            double bulk = -20 + 10 * random.NextDouble();
            return new SitePotential(p, bulk + v[i] + offset, bulk);
        }).ToList();
        var bare = FiniteSizeCorrector.Correct(cell, eps, model, charge, DefectPosition, null);
        var aligned = FiniteSizeCorrector.Correct(cell, eps, model, charge, DefectPosition, new AlignmentInput.AtomicSites(sites));
        Assert.Equal(bare.ImageChargeEv, aligned.ImageChargeEv);
        Assert.Equal(-charge * offset, aligned.AlignmentEv, ExactVolts);
        Assert.Equal(AlignmentMethod.AtomicSites, aligned.Alignment!.Method);
        Assert.True(aligned.Alignment.PointsUsed > 0 && aligned.Alignment.PointsUsed < sites.Count, "the sites near the defect are left out");
        Assert.True(aligned.Alignment.SignCorrelation > 0.99);

        // The sphere is inscribed in the Wigner–Seitz cell: half the shortest lattice vector (common practice).
        double radius = aligned.Alignment.SamplingRadiusAngstrom;
        Assert.Equal(0.5 * Math.Min(cell.A.Length, Math.Min(cell.B.Length, cell.C.Length)), radius, 1e-12);
    }

    [Fact]
    public void Sign_convention_is_checked_and_electron_energies_are_negated()
    {
        var cell = TestCells.Triclinic();
        var eps = TestCells.FullTensor();
        var positions = Sites(60, 13);
        double[] v = ModelPotential.AtSites(cell, eps, ModelCharge.Default, 2, DefectPosition, positions);
        var electrostatic = positions.Select((p, i) => new SitePotential(p, -7 + v[i] + 0.1, -7)).ToList();
        var electronEnergies = electrostatic.Select(s => s with { DefectCell = -s.DefectCell, BulkCell = -s.BulkCell }).ToList();

        var right = FiniteSizeCorrector.Correct(cell, eps, ModelCharge.Default, 2, DefectPosition, new AlignmentInput.AtomicSites(electrostatic));
        // Electron potential energies declared as such give the same ΔV.
        var declared = FiniteSizeCorrector.Correct(cell, eps, ModelCharge.Default, 2, DefectPosition,
            new AlignmentInput.AtomicSites(electronEnergies, PotentialSign.ElectronPotentialEnergy));
        Assert.Equal(right.Alignment!.ShiftVolts, declared.Alignment!.ShiftVolts, ExactVolts);
        // ... and declared wrongly they are refused, saying why.
        var e = Assert.Throws<DefectInputException>(() =>
            FiniteSizeCorrector.Correct(cell, eps, ModelCharge.Default, 2, DefectPosition, new AlignmentInput.AtomicSites(electronEnergies)));
        Assert.Contains("electron potential energies", e.Message);
        Assert.EndsWith(".sign", e.Field);
    }

    [Fact]
    public void Bad_planar_input_is_refused_with_the_field()
    {
        var cell = TestCells.Triclinic();
        var eps = DielectricTensor.Scalar(5);
        var mismatch = new AlignmentInput.PlanarAverages([new PlanarProfile(0, new double[10], new double[12])]);
        var e = Assert.Throws<DefectInputException>(() => FiniteSizeCorrector.Correct(cell, eps, ModelCharge.Default, 1, DefectPosition, mismatch, field: "defects[0].charge_states[1].alignment"));
        Assert.Equal("defects[0].charge_states[1].alignment.profiles[0].bulk_cell", e.Field);
        var twice = new AlignmentInput.PlanarAverages([new PlanarProfile(1, new double[8], new double[8]), new PlanarProfile(1, new double[8], new double[8])]);
        Assert.Contains("given twice", Assert.Throws<DefectInputException>(() => FiniteSizeCorrector.Correct(cell, eps, ModelCharge.Default, 1, DefectPosition, twice)).Message);
    }

    private static void AssertClose(double[] expected, double[] actual, double tolerance)
    {
        Assert.Equal(expected.Length, actual.Length);
        for (int i = 0; i < expected.Length; i++)
        {
            Assert.True(Math.Abs(expected[i] - actual[i]) <= tolerance, $"point {i}: reference {expected[i]:R}, ours {actual[i]:R}");
        }
    }
}
