using System.Text.Json.Nodes;
using Hull.Core.Defects;

namespace Hull.Core.Tests.References;

/// <summary>
/// Runs <c>carriers.py</c> (SciPy quad and brentq, mpmath; Debian's /usr/bin/python3) on a batch of tasks: the
/// Fermi–Dirac integral and charge neutrality written there from the textbook formulas, independently of the library.
/// </summary>
public sealed class CarriersReference
{
    private readonly PythonTaskBatch _batch = new("carriers.py");

    public int FermiDirac(IReadOnlyList<double> eta) => Add(new JsonObject { ["kind"] = "fd_half", ["eta"] = Numbers(eta) });

    /// <summary>A neutrality task; <paramref name="frozen"/> gives fixed totals per defect, <paramref name="edges"/> moved band edges.</summary>
    public int Neutrality(DefectEnsemble ensemble, double nc300, double nv300, double temperatureK, CarrierStatistics statistics,
        ConcentrationForm form = ConcentrationForm.Dilute, double donors = 0, double acceptors = 0, IReadOnlyList<double>? frozen = null, BandEdges? edges = null)
    {
        var defects = new JsonArray();
        foreach (var s in ensemble.Species)
        {
            defects.Add(new JsonObject
            {
                ["sites"] = s.SitesPerCubicCentimetre,
                ["site_set"] = s.SiteSet,
                ["states"] = new JsonArray([.. s.ChargeStates.Select(c => (JsonNode)new JsonArray(c.Charge, c.FormationEnergyAtVbmEv, c.Degeneracy))]),
            });
        }

        var task = new JsonObject
        {
            ["kind"] = "neutrality", ["T"] = temperatureK, ["gap"] = ensemble.BandGapEv, ["nc300"] = nc300, ["nv300"] = nv300,
            ["stats"] = statistics == CarrierStatistics.FermiDirac ? "fd" : "boltzmann",
            ["form"] = form == ConcentrationForm.SiteBlocking ? "blocking" : "dilute",
            ["donors"] = donors, ["acceptors"] = acceptors, ["defects"] = defects,
        };
        if (frozen is not null) task["frozen"] = Numbers(frozen);
        if (edges is not null) task["edges"] = new JsonArray(edges.ValenceEv, edges.ConductionEv);
        return Add(task);
    }

    /// <summary>The positive real roots of a quartic (highest power first), at 50 digits.</summary>
    public int QuarticRoots(IReadOnlyList<double> coefficients) => Add(new JsonObject { ["kind"] = "quartic", ["coefficients"] = Numbers(coefficients) });

    public JsonArray Run() => _batch.Run();

    public static double[] Values(JsonNode? node) => PythonTaskBatch.Numbers(node);

    private static JsonArray Numbers(IReadOnlyList<double> values) => new([.. values.Select(v => (JsonNode)v)]);

    private int Add(JsonObject task) => _batch.Add(task);
}
