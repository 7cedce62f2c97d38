using System.Globalization;
using System.Text.Json;
using Hull.Core.Defects;

namespace Hull.Server.Defects;

/// <summary>
/// Reads the study file: a JSON document (host, model charge, defects, alignment potentials) and a CSV table with
/// one row per charge state. Errors name the JSON path or the CSV line and column.
/// </summary>
/// <remarks>
/// JSON: <c>{"layout": "hull-defect-study-1", "host": {...}, "model_charge": {...}?, "defects": [...]}</c>; host:
/// formula, formula_units, atoms {element: count}, total_energy_ev, lattice_vectors_angstrom (3 rows), vbm_ev,
/// band_gap_ev, dielectric (a number or 3 rows); model_charge: {"point": true} or {"gaussian_width_angstrom": σ};
/// each defect: name, kind (vacancy|interstitial|antisite|substitution|complex), atoms {element: ±n}, site_set,
/// sites_per_formula_unit or sites_per_cm3, degeneracy (default 1), position_fractional, constituents (complexes),
/// alignment [{charge, planar: {sign?, plateau_width_fraction?, profiles: [{axis, defect_cell, bulk_cell}]}
/// | sites: {sign?, sites: [{fractional, defect_cell, bulk_cell}]} | shift_volts}].
/// Optional "carriers" block (needed by the Fermi-level and solubility calls): the bands one way,
/// conduction_states_300k_per_cm3 and valence_states_300k_per_cm3 (N_c, N_v at 300 K), or electron_mass_ratio and
/// hole_mass_ratio (density-of-states masses, valley degeneracy included), or density_of_states
/// [{energy_ev, states_per_ev_cm3}] (eV above the VBM, empty inside the gap); gap_temperature {alpha_ev_per_k,
/// beta_k, reference_temperature_k, valence_band_share} (optional); extra_donors_per_cm3, extra_acceptors_per_cm3
/// (optional, fully ionised, default 0).
/// CSV header: <c>defect,charge,total_energy_ev</c>, optionally <c>shift_volts</c> (a given ΔV); every defect needs
/// at least one row, every row a known defect.
/// </remarks>
public static class DefectStudyFile
{
    /// <summary>The value of the document's "layout" field this reader understands.</summary>
    public const string Layout = "hull-defect-study-1";

    private static readonly string[] RequiredColumns = ["defect", "charge", "total_energy_ev"];

    /// <summary>Parses and checks both texts into a study (corrections worked out).</summary>
    public static DefectStudy Read(string studyJson, string chargeStatesCsv)
    {
        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(studyJson, new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Disallow });
        }
        catch (JsonException e)
        {
            throw new DefectInputException("study_json", $"not valid JSON (line {e.LineNumber + 1}, byte {e.BytePositionInLine + 1}): {e.Message}");
        }

        using (document)
        {
            var root = document.RootElement;
            if (root.ValueKind != JsonValueKind.Object) throw new DefectInputException("study_json", "the study document must be a JSON object");
            string layout = Text(root, "layout", "layout");
            if (layout != Layout) throw new DefectInputException("layout", $"unknown layout '{layout}'; this server reads '{Layout}'");
            var bulk = ReadHost(Property(root, "host", "host"));
            var model = root.TryGetProperty("model_charge", out var m) ? ReadModel(m) : ModelCharge.Default;
            if (root.TryGetProperty("carriers", out var carriers)) ReadCarrierBlock(carriers, bulk.BandGapEv);
            var rows = ReadTable(chargeStatesCsv);
            var defectsJson = Property(root, "defects", "defects");
            if (defectsJson.ValueKind != JsonValueKind.Array) throw new DefectInputException("defects", "must be an array");
            var defects = new List<DefectInput>();
            int d = 0;
            foreach (var item in defectsJson.EnumerateArray())
            {
                defects.Add(ReadDefect(item, $"defects[{d}]", rows));
                d++;
            }

            foreach (var row in rows.Where(r => !defects.Any(x => x.Name == r.Defect)))
            {
                throw new DefectInputException($"charge_states_csv line {row.Line}", $"defect '{row.Defect}' is not in the study document");
            }

            return DefectStudy.Create(bulk, defects, model);
        }
    }

    /// <summary>
    /// The document's "carriers" block checked against the host's gap, or null when it has none (a study of
    /// formation energies alone). Call on a document <see cref="Read"/> accepted.
    /// </summary>
    public static StudyCarriers? ReadCarriers(string studyJson)
    {
        using var document = JsonDocument.Parse(studyJson);
        var root = document.RootElement;
        if (!root.TryGetProperty("carriers", out var carriers)) return null;
        return ReadCarrierBlock(carriers, Double(Property(root, "host", "host"), "band_gap_ev", "host.band_gap_ev"));
    }

    private static readonly string[] CarrierKeys =
    [
        "conduction_states_300k_per_cm3", "valence_states_300k_per_cm3", "electron_mass_ratio", "hole_mass_ratio", "density_of_states",
        "gap_temperature", "extra_donors_per_cm3", "extra_acceptors_per_cm3",
    ];

    private static StudyCarriers ReadCarrierBlock(JsonElement c, double bandGapEv)
    {
        if (c.ValueKind != JsonValueKind.Object) throw new DefectInputException("carriers", "must be a JSON object");
        foreach (var p in c.EnumerateObject().Where(p => !CarrierKeys.Contains(p.Name)))
        {
            throw new DefectInputException($"carriers.{p.Name}", $"not a field of the carriers block (its fields: {string.Join(", ", CarrierKeys)})");
        }

        bool Has(string name) => c.TryGetProperty(name, out _);
        bool states = Has("conduction_states_300k_per_cm3") || Has("valence_states_300k_per_cm3");
        bool masses = Has("electron_mass_ratio") || Has("hole_mass_ratio");
        bool table = Has("density_of_states");
        if ((states ? 1 : 0) + (masses ? 1 : 0) + (table ? 1 : 0) != 1)
        {
            throw new DefectInputException("carriers", "give the bands one way: conduction_states_300k_per_cm3 with valence_states_300k_per_cm3, electron_mass_ratio with hole_mass_ratio, or density_of_states");
        }

        BandStates bands = states
            ? ParabolicBands.FromEffectiveStates(
                Double(c, "conduction_states_300k_per_cm3", "carriers.conduction_states_300k_per_cm3"),
                Double(c, "valence_states_300k_per_cm3", "carriers.valence_states_300k_per_cm3"))
            : masses
                ? ParabolicBands.FromEffectiveMasses(Double(c, "electron_mass_ratio", "carriers.electron_mass_ratio"), Double(c, "hole_mass_ratio", "carriers.hole_mass_ratio"))
                : ReadDensityOfStates(c.GetProperty("density_of_states"));
        GapTemperatureDependence? gap = null;
        if (c.TryGetProperty("gap_temperature", out var g))
        {
            const string f = "carriers.gap_temperature";
            gap = new GapTemperatureDependence(Double(g, "alpha_ev_per_k", $"{f}.alpha_ev_per_k"), Double(g, "beta_k", $"{f}.beta_k"),
                Double(g, "reference_temperature_k", $"{f}.reference_temperature_k"), Double(g, "valence_band_share", $"{f}.valence_band_share"));
        }

        double donors = Has("extra_donors_per_cm3") ? Double(c, "extra_donors_per_cm3", "carriers.extra_donors_per_cm3") : 0;
        double acceptors = Has("extra_acceptors_per_cm3") ? Double(c, "extra_acceptors_per_cm3", "carriers.extra_acceptors_per_cm3") : 0;
        var carriers = new StudyCarriers(bands, gap, donors, acceptors);
        carriers.Model(CarrierStatistics.FermiDirac, ConcentrationForm.Dilute).Check(bandGapEv);
        return carriers;
    }

    private static TabulatedBands ReadDensityOfStates(JsonElement table)
    {
        const string f = "carriers.density_of_states";
        if (table.ValueKind != JsonValueKind.Array) throw new DefectInputException(f, "must be an array of {energy_ev, states_per_ev_cm3}");
        var energies = new List<double>();
        var densities = new List<double>();
        int i = 0;
        foreach (var point in table.EnumerateArray())
        {
            energies.Add(Double(point, "energy_ev", $"{f}[{i}].energy_ev"));
            densities.Add(Double(point, "states_per_ev_cm3", $"{f}[{i}].states_per_ev_cm3"));
            i++;
        }

        return TabulatedBands.Create(energies, densities, f);
    }

    private sealed record Row(int Line, string Defect, int Charge, double EnergyEv, double? ShiftVolts);

    private static List<Row> ReadTable(string csv)
    {
        var lines = csv.Replace("\r\n", "\n").Split('\n');
        if (lines.Length == 0 || string.IsNullOrWhiteSpace(lines[0])) throw new DefectInputException("charge_states_csv", "the charge-state table has no header");
        string[] header = [.. lines[0].TrimStart('\uFEFF').Split(',').Select(h => h.Trim())];
        foreach (string column in RequiredColumns)
        {
            if (!header.Contains(column)) throw new DefectInputException("charge_states_csv line 1", $"the header lacks the column '{column}' (needs {string.Join(",", RequiredColumns)})");
        }

        int iDefect = Array.IndexOf(header, "defect"), iCharge = Array.IndexOf(header, "charge"), iEnergy = Array.IndexOf(header, "total_energy_ev"), iShift = Array.IndexOf(header, "shift_volts");
        var rows = new List<Row>();
        for (int l = 1; l < lines.Length; l++)
        {
            if (string.IsNullOrWhiteSpace(lines[l])) continue;
            string where = $"charge_states_csv line {l + 1}";
            string[] cells = [.. lines[l].Split(',').Select(c => c.Trim())];
            if (cells.Length != header.Length) throw new DefectInputException(where, $"{cells.Length} cells, but the header has {header.Length}");
            if (!int.TryParse(cells[iCharge], NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out int charge))
            {
                throw new DefectInputException($"{where} column charge", $"'{cells[iCharge]}' is not a whole number");
            }

            double energy = Number(cells[iEnergy], $"{where} column total_energy_ev");
            double? shift = iShift >= 0 && cells[iShift].Length > 0 ? Number(cells[iShift], $"{where} column shift_volts") : null;
            if (cells[iDefect].Length == 0) throw new DefectInputException($"{where} column defect", "empty defect name");
            rows.Add(new Row(l + 1, cells[iDefect], charge, energy, shift));
        }

        return rows;
    }

    private static BulkSupercell ReadHost(JsonElement host)
    {
        var rows = Matrix(Property(host, "lattice_vectors_angstrom", "host.lattice_vectors_angstrom"), "host.lattice_vectors_angstrom");
        var lattice = LatticeCell.FromRows(rows, "host.lattice_vectors_angstrom");
        var eps = Property(host, "dielectric", "host.dielectric");
        var dielectric = eps.ValueKind == JsonValueKind.Number
            ? DielectricTensor.Scalar(eps.GetDouble(), "host.dielectric")
            : DielectricTensor.FromMatrix(Matrix(eps, "host.dielectric"), "host.dielectric");
        return new BulkSupercell(
            Text(host, "formula", "host.formula"),
            (int)Double(host, "formula_units", "host.formula_units"),
            Counts(Property(host, "atoms", "host.atoms"), "host.atoms"),
            Double(host, "total_energy_ev", "host.total_energy_ev"),
            lattice,
            Double(host, "vbm_ev", "host.vbm_ev"),
            Double(host, "band_gap_ev", "host.band_gap_ev"),
            dielectric);
    }

    private static ModelCharge ReadModel(JsonElement model)
    {
        if (model.TryGetProperty("point", out var p) && p.ValueKind == JsonValueKind.True) return ModelCharge.Point;
        return ModelCharge.Gaussian(Double(model, "gaussian_width_angstrom", "model_charge.gaussian_width_angstrom"), "model_charge.gaussian_width_angstrom");
    }

    private static DefectInput ReadDefect(JsonElement item, string field, List<Row> rows)
    {
        string name = Text(item, "name", $"{field}.name");
        string kindText = Text(item, "kind", $"{field}.kind");
        DefectKind kind = kindText switch
        {
            "vacancy" => DefectKind.Vacancy,
            "interstitial" => DefectKind.Interstitial,
            "antisite" => DefectKind.Antisite,
            "substitution" => DefectKind.Substitution,
            "complex" => DefectKind.Complex,
            _ => throw new DefectInputException($"{field}.kind", $"'{kindText}' is not one of vacancy, interstitial, antisite, substitution, complex"),
        };
        SiteDensity sites = item.TryGetProperty("sites_per_cm3", out _)
            ? SiteDensity.PerCubicCentimetre(Double(item, "sites_per_cm3", $"{field}.sites_per_cm3"))
            : SiteDensity.PerFormulaUnit(Double(item, "sites_per_formula_unit", $"{field}.sites_per_formula_unit"));
        var position = Vector(Property(item, "position_fractional", $"{field}.position_fractional"), $"{field}.position_fractional");
        var alignments = new Dictionary<int, AlignmentInput>();
        if (item.TryGetProperty("alignment", out var alignmentJson))
        {
            int a = 0;
            foreach (var entry in alignmentJson.EnumerateArray())
            {
                string where = $"{field}.alignment[{a}]";
                int charge = (int)Double(entry, "charge", $"{where}.charge");
                if (!alignments.TryAdd(charge, ReadAlignment(entry, where))) throw new DefectInputException($"{where}.charge", $"charge {charge} has two alignment inputs");
                a++;
            }
        }

        var states = new List<ChargeStateInput>();
        foreach (var row in rows.Where(r => r.Defect == name))
        {
            AlignmentInput? alignment = alignments.GetValueOrDefault(row.Charge);
            if (row.ShiftVolts is { } shift)
            {
                if (alignment is not null) throw new DefectInputException($"charge_states_csv line {row.Line}", $"{name} {row.Charge}: a shift in the table and potentials in the document; give one");
                alignment = new AlignmentInput.GivenShift(shift);
            }

            states.Add(new ChargeStateInput(row.Charge, row.EnergyEv, alignment));
        }

        foreach (int charge in alignments.Keys.Where(c => !states.Any(s => s.Charge == c)))
        {
            throw new DefectInputException($"{field}.alignment", $"alignment input for {name} charge {charge}, which has no row in the charge-state table");
        }

        if (states.Count == 0) throw new DefectInputException($"{field}", $"'{name}' has no row in the charge-state table");
        IReadOnlyList<string>? parts = item.TryGetProperty("constituents", out var c) ? [.. c.EnumerateArray().Select(x => x.GetString() ?? "")] : null;
        double degeneracy = item.TryGetProperty("degeneracy", out _) ? Double(item, "degeneracy", $"{field}.degeneracy") : 1;
        return new DefectInput(name, kind, Counts(Property(item, "atoms", $"{field}.atoms"), $"{field}.atoms"),
            Text(item, "site_set", $"{field}.site_set"), sites, degeneracy, position, states, parts);
    }

    private static AlignmentInput ReadAlignment(JsonElement entry, string where)
    {
        PotentialSign Sign(JsonElement e, string f) => e.TryGetProperty("sign", out var s)
            ? s.GetString() switch
            {
                "electrostatic" => PotentialSign.Electrostatic,
                "electron_energy" => PotentialSign.ElectronPotentialEnergy,
                _ => throw new DefectInputException($"{f}.sign", "sign is 'electrostatic' (V) or 'electron_energy' (eV)"),
            }
            : PotentialSign.Electrostatic;
        if (entry.TryGetProperty("planar", out var planar))
        {
            var profiles = new List<PlanarProfile>();
            int p = 0;
            foreach (var profile in Property(planar, "profiles", $"{where}.planar.profiles").EnumerateArray())
            {
                string f = $"{where}.planar.profiles[{p++}]";
                profiles.Add(new PlanarProfile((int)Double(profile, "axis", $"{f}.axis"), Numbers(Property(profile, "defect_cell", $"{f}.defect_cell"), $"{f}.defect_cell"),
                    Numbers(Property(profile, "bulk_cell", $"{f}.bulk_cell"), $"{f}.bulk_cell")));
            }

            double? width = planar.TryGetProperty("plateau_width_fraction", out _) ? Double(planar, "plateau_width_fraction", $"{where}.planar.plateau_width_fraction") : null;
            return new AlignmentInput.PlanarAverages(profiles, Sign(planar, $"{where}.planar"), width);
        }

        if (entry.TryGetProperty("sites", out var sites))
        {
            var list = new List<SitePotential>();
            int s = 0;
            foreach (var site in Property(sites, "sites", $"{where}.sites.sites").EnumerateArray())
            {
                string f = $"{where}.sites.sites[{s++}]";
                list.Add(new SitePotential(Vector(Property(site, "fractional", $"{f}.fractional"), $"{f}.fractional"),
                    Double(site, "defect_cell", $"{f}.defect_cell"), Double(site, "bulk_cell", $"{f}.bulk_cell")));
            }

            return new AlignmentInput.AtomicSites(list, Sign(sites, $"{where}.sites"));
        }

        if (entry.TryGetProperty("shift_volts", out _)) return new AlignmentInput.GivenShift(Double(entry, "shift_volts", $"{where}.shift_volts"));
        throw new DefectInputException(where, "an alignment entry holds 'planar', 'sites' or 'shift_volts'");
    }

    private static JsonElement Property(JsonElement e, string name, string field)
    {
        if (e.ValueKind != JsonValueKind.Object) throw new DefectInputException(field, "expected a JSON object around this field");
        return e.TryGetProperty(name, out var v) ? v : throw new DefectInputException(field, "missing");
    }

    private static string Text(JsonElement e, string name, string field)
    {
        var v = Property(e, name, field);
        return v.ValueKind == JsonValueKind.String ? v.GetString()! : throw new DefectInputException(field, "must be a string");
    }

    private static double Double(JsonElement e, string name, string field)
    {
        var v = Property(e, name, field);
        return v.ValueKind == JsonValueKind.Number ? v.GetDouble() : throw new DefectInputException(field, "must be a number");
    }

    private static double Number(string text, string field) =>
        double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double v) && double.IsFinite(v)
            ? v
            : throw new DefectInputException(field, $"'{text}' is not a finite number");

    private static double[] Numbers(JsonElement e, string field)
    {
        if (e.ValueKind != JsonValueKind.Array) throw new DefectInputException(field, "must be an array of numbers");
        return [.. e.EnumerateArray().Select((x, i) => x.ValueKind == JsonValueKind.Number ? x.GetDouble() : throw new DefectInputException($"{field}[{i}]", "must be a number"))];
    }

    private static Vector3D Vector(JsonElement e, string field)
    {
        double[] v = Numbers(e, field);
        return v.Length == 3 ? new Vector3D(v[0], v[1], v[2]) : throw new DefectInputException(field, "must hold three numbers");
    }

    private static Matrix3 Matrix(JsonElement e, string field)
    {
        if (e.ValueKind != JsonValueKind.Array || e.GetArrayLength() != 3) throw new DefectInputException(field, "must be three rows of three numbers");
        var rows = e.EnumerateArray().Select((r, i) => (IReadOnlyList<double>)Numbers(r, $"{field}[{i}]")).ToList();
        if (rows.Any(r => r.Count != 3)) throw new DefectInputException(field, "must be three rows of three numbers");
        return Matrix3.FromRows(rows);
    }

    private static Dictionary<string, int> Counts(JsonElement e, string field)
    {
        if (e.ValueKind != JsonValueKind.Object) throw new DefectInputException(field, "must be an object of element → whole number");
        var result = new Dictionary<string, int>(StringComparer.Ordinal);
        foreach (var p in e.EnumerateObject())
        {
            if (p.Value.ValueKind != JsonValueKind.Number || !p.Value.TryGetInt32(out int n)) throw new DefectInputException($"{field}.{p.Name}", "must be a whole number");
            result[p.Name] = n;
        }

        return result;
    }
}
