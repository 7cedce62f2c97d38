using System.Text.Json;
using System.Text.Json.Nodes;
using Hull.Core.Defects;

namespace Hull.Core.Tests.References;

/// <summary>
/// Runs <c>defect_electrostatics.py</c> (NumPy/SciPy, Debian's /usr/bin/python3) on a batch of tasks: the lattice
/// correction, site potentials and planar averages of a model charge computed in the physical frame from the
/// definitions, independently of the library's change of frame and kernels.
/// </summary>
public sealed class ElectrostaticsReference
{
    private readonly PythonTaskBatch _batch = new("defect_electrostatics.py");

    public int Lattice(LatticeCell cell, DielectricTensor eps, ModelCharge model, int q) =>
        Add(new JsonObject { ["kind"] = "lattice", ["cell"] = Rows(cell.Rows), ["eps"] = Rows(eps.Tensor), ["cov"] = Rows(model.Covariance), ["q"] = q });

    public int Sites(LatticeCell cell, DielectricTensor eps, ModelCharge model, int q, Vector3D defect, IReadOnlyList<Vector3D> sites) =>
        Add(new JsonObject
        {
            ["kind"] = "sites", ["cell"] = Rows(cell.Rows), ["eps"] = Rows(eps.Tensor), ["cov"] = Rows(model.Covariance), ["q"] = q,
            ["defect"] = Vector(defect), ["sites"] = new JsonArray([.. sites.Select(s => (JsonNode)Vector(s))]),
        });

    public int Planar(LatticeCell cell, DielectricTensor eps, ModelCharge model, int q, double f0, int axis, int n) =>
        Add(new JsonObject
        {
            ["kind"] = "planar", ["cell"] = Rows(cell.Rows), ["eps"] = Rows(eps.Tensor), ["cov"] = Rows(model.Covariance), ["q"] = q,
            ["f0"] = f0, ["axis"] = axis, ["n"] = n,
        });

    public int Erfc(IReadOnlyList<double> x) => Add(new JsonObject { ["kind"] = "erfc", ["x"] = new JsonArray([.. x.Select(v => (JsonNode)v)]) });

    /// <summary>Runs every task added so far; result i is a number or an array of numbers.</summary>
    public JsonArray Run() => _batch.Run();

    public static double[] Numbers(JsonNode? node) => PythonTaskBatch.Numbers(node);

    private int Add(JsonObject task) => _batch.Add(task);

    private static JsonArray Rows(Matrix3 m) => new([.. m.ToRows().Select(r => (JsonNode)new JsonArray([.. r.Select(v => (JsonNode)v)]))]);

    private static JsonArray Vector(Vector3D v) => [v.X, v.Y, v.Z];
}
