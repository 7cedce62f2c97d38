using System.CommandLine;
using System.Globalization;
using System.Text;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// `hull odds`: stability under the entries' energy uncertainty (SampleStability), one row per entry; with
/// `--figure` also the ternary of vertex probabilities (DrawStabilityOddsFigure). Every number comes from the server.
/// </summary>
public static class OddsCommand
{
    public static Command Build(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var system = new Argument<string>("system") { Description = "the chemical system, e.g. Li-Co-O: every entry within it is sampled" };
        var version = CommandTree.VersionOption();
        var references = ReferenceOption.Create();
        var samples = ValueOptions.WholeNumber("--samples", "number of samples (default 1000; at most 100000, and samples x entries at most 2e7)", 2, int.MaxValue, 0, "a sample count");
        var target = ValueOptions.OptionalNumber("--target-se", "sample in batches of 250 until every vertex probability's standard error is at most this", "a probability's standard error");
        var seed = ValueOptions.WholeNumber("--seed", "seed of every draw: the same seed and version give the same answer (default 0)", 0, long.MaxValue, 0, "a seed");
        var groups = new Option<string[]>("--group-sigma")
        {
            Description = "shared error of a correlation group, GROUP=EV_PER_ATOM (repeatable), e.g. --group-sigma ml-model=0.03",
            Arity = ArgumentArity.ZeroOrMore,
        };
        var figure = new Option<string?>("--figure") { Description = "also write the ternary of vertex probabilities to this SVG file (three-element systems)" };
        var command = new Command("odds", "stability under energy uncertainty: each entry's probability of being a hull vertex, its energy above hull range, its likeliest decomposition")
        {
            dataset, system, version, references, samples, target, seed, groups, figure,
        };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new SampleStabilityRequest { Dataset = c.Get(dataset)!, Version = c.Get(version), ChemicalSystem = c.Get(system)!, Samples = checked((int)c.Get(samples)), Seed = (ulong)c.Get(seed) };
            if (c.Get(target) is double se) request.TargetStandardError = se;
            ReferenceOption.AddTo(request.ElementalReferences, c.Get(references));
            foreach (string text in c.Get(groups) ?? [])
            {
                (string name, double sigma) = ElectrochemistryCommands.ParseElementValue(text, "--group-sigma", "ml-model=0.03");
                request.GroupSigmas.Add(new GroupSigma { Group = name, SigmaEvPerAtom = sigma });
            }

            SampleStabilityResponse response = await c.Server.Uncertainty.SampleStabilityAsync(request, c.Server.Call(t));
            string caption = Caption(response);
            if (c.Get(figure) is { } path)
            {
                DrawStabilityOddsFigureResponse drawn = await c.Server.Uncertainty.DrawStabilityOddsFigureAsync(
                    new DrawStabilityOddsFigureRequest { Sampling = request }, c.Server.Call(t));
                await File.WriteAllTextAsync(path, drawn.Svg, new UTF8Encoding(false), t);
                c.Err.WriteLine($"wrote {path}");
            }

            c.Emit(response, () => OddsTable(response), caption);
            return ExitCodes.Ok;
        }));
        return command;
    }

    internal static Table OddsTable(SampleStabilityResponse response)
    {
        var table = new Table("entry_id", "formula", "sigma_ev_per_atom", "group", "p_vertex", "p_vertex_se", "mean_above_hull_ev_per_atom",
            "above_hull_p05_ev_per_atom", "above_hull_p95_ev_per_atom", "likeliest_products", "p_products", "plain_vertex", "plain_above_hull_ev_per_atom");
        foreach (EntryStabilityOdds o in response.Entries)
        {
            table.Add(o.EntryId, o.Formula, o.SigmaEvPerAtom, o.CorrelationGroup, o.VertexProbability, o.VertexProbabilityStandardError,
                o.MeanEnergyAboveHullEvPerAtom, o.EnergyAboveHullP05EvPerAtom, o.EnergyAboveHullP95EvPerAtom,
                string.Join(" + ", o.MostProbableProducts), o.MostProbableProductsProbability, o.PlainIsHullVertex, o.PlainEnergyAboveHullEvPerAtom);
        }

        return table;
    }

    internal static string Caption(SampleStabilityResponse r)
    {
        string stop = r.Stop switch
        {
            SamplingStop.TargetReached => $"target standard error {Number(r.TargetStandardError)} reached",
            SamplingStop.WorkLimitReached => $"work limit reached before the target standard error {Number(r.TargetStandardError)}",
            _ => "as many samples as asked",
        };
        string groups = r.Groups.Count == 0 ? "no correlation groups" : "groups " + string.Join(", ", r.Groups.Select(g => $"{g.Group} σ {Number(g.SigmaEvPerAtom)} eV/atom"));
        return $"{VersionText.Of(r.Used)}, system {r.ChemicalSystem}: {r.SampleCount} samples, seed {r.Seed} ({stop}; largest vertex-probability SE {Number(r.LargestVertexStandardError)}); {groups}\n"
            + $"probable stable set (vertex in >= 50% of samples): {string.Join(", ", r.ProbableStableSet)}\n"
            + $"stable set seen most often ({Number(r.MostFrequentStableSetProbability * 100)}% of samples): {string.Join(", ", r.MostFrequentStableSet)}";
    }

    private static string Number(double value) => value.ToString("G4", CultureInfo.InvariantCulture);
}
