using System.Text;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// Randomised malformed and hostile requests (seeded, bounded): typed requests with garbage in every field must get
/// a documented client-error status, never INTERNAL; raw bytes that are not protobuf at all must be refused; and
/// afterwards the server is still up and answers correctly.
/// </summary>
public sealed class HostileRequestTests
{
    private const int TypedRequests = 400;
    private const int RawRequests = 100;

    private static readonly StatusCode[] ClientErrors =
        [StatusCode.OK, StatusCode.InvalidArgument, StatusCode.NotFound, StatusCode.FailedPrecondition, StatusCode.ResourceExhausted, StatusCode.AlreadyExists];

    [Fact]
    public async Task Garbage_requests_get_client_errors_and_leave_the_server_answering()
    {
        await using var s = await RunningServer.StartAsync(o => o with { Limits = o.Limits with { MaxReceiveMessageBytes = 256 * 1024 } });
        var c = s.Clients;
        await Data.CreateWithAsync(c, "d", Data.LiCoO());
        var random = new Random(20261201);

        for (int i = 0; i < TypedRequests; i++)
        {
            StatusCode code = await SendTypedAsync(c, random);
            Assert.True(ClientErrors.Contains(code), $"request {i} got {code}");
        }

        var invoker = c.Channel.CreateCallInvoker();
        var bytes = Marshallers.Create(b => b, b => b);
        string[] paths =
        [
            "/hull.v1.DatasetService/ImportEntries", "/hull.v1.StabilityService/GetHullEnergies", "/hull.v1.StabilityService/AssessCandidates",
            "/hull.v1.DatasetService/CreateDataset", "/hull.v1.NoSuchService/Nothing",
        ];
        for (int i = 0; i < RawRequests; i++)
        {
            string path = paths[random.Next(paths.Length)];
            var raw = new Method<byte[], byte[]>(MethodType.Unary, path.Split('/')[1], path.Split('/')[2], bytes, bytes);
            byte[] payload = new byte[random.Next(0, 4096)];
            random.NextBytes(payload);
            try
            {
                await invoker.AsyncUnaryCall(raw, null, c.Call(TimeSpan.FromSeconds(20)), payload);
            }
            catch (RpcException e)
            {
                Assert.NotEqual(StatusCode.Unavailable, e.StatusCode);
                Assert.NotEqual(StatusCode.DeadlineExceeded, e.StatusCode);
            }

        }

        var health = new Grpc.Health.V1.Health.HealthClient(c.Channel);
        Assert.Equal(Grpc.Health.V1.HealthCheckResponse.Types.ServingStatus.Serving, (await health.CheckAsync(new(), c.Call())).Status);
        var energies = await c.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "d", Version = 1, Formulas = { "LiCoO2" } }, c.Call());
        Assert.Equal(-1.8, energies.Results[0].HullEnergyEvPerAtom, 12);
    }

    private static async Task<StatusCode> SendTypedAsync(Clients c, Random random)
    {
        try
        {
            switch (random.Next(6))
            {
                case 0:
                    var batch = new ImportEntriesRequest { Dataset = Name(random), DuplicatePolicy = (DuplicatePolicy)random.Next(-1, 4), Note = Text(random, 50) };
                    int rows = random.Next(0, 40);
                    for (int r = 0; r < rows; r++)
                    {
                        batch.Entries.Add(new Entry { Id = Text(random, 20), Formula = Formula(random), EnergyEv = Energy(random), Basis = (EnergyBasis)random.Next(-2, 7), Note = Text(random, 30) });
                    }

                    await c.Datasets.ImportEntriesAsync(batch, c.Call());
                    break;
                case 1:
                    var energies = new GetHullEnergiesRequest { Dataset = Name(random), Version = random.Next(-3, 4) };
                    for (int r = random.Next(0, 6); r > 0; r--) energies.Formulas.Add(Formula(random));
                    await c.Stability.GetHullEnergiesAsync(energies, c.Call());
                    break;
                case 2:
                    var assess = new AssessCandidatesRequest { Dataset = Name(random), Version = random.Next(-1, 3) };
                    for (int r = random.Next(0, 6); r > 0; r--)
                    {
                        assess.Candidates.Add(new Candidate { Label = Text(random, 10), Formula = Formula(random), EnergyEv = Energy(random), Basis = (EnergyBasis)random.Next(-1, 6) });
                    }

                    await c.Stability.AssessCandidatesAsync(assess, c.Call());
                    break;
                case 3:
                    await c.Stability.GetHullFacetsAsync(new GetHullFacetsRequest { Dataset = Name(random), Version = random.Next(-1, 3), ChemicalSystem = System(random) }, c.Call());
                    break;
                case 4:
                    var stability = new GetEntryStabilityRequest { Dataset = Name(random), Version = random.Next(-1, 3) };
                    for (int r = random.Next(0, 4); r > 0; r--) stability.EntryIds.Add(random.Next(2) == 0 ? "LiCoO2" : Text(random, 12));
                    await c.Stability.GetEntryStabilityAsync(stability, c.Call());
                    break;
                default:
                    using (var call = c.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = Name(random), Version = random.Next(-2, 3), PageSize = random.Next(-5, 20_000) }, c.Call()))
                    {
                        await foreach (var _ in call.ResponseStream.ReadAllAsync())
                        {
                        }
                    }

                    break;
            }

            return StatusCode.OK;
        }
        catch (RpcException e)
        {
            return e.StatusCode;
        }
    }

    private static string Name(Random random) => random.Next(4) switch
    {
        0 => "d",
        1 => "D",
        2 => Text(random, 80),
        _ => "nope-" + random.Next(100),
    };

    private static double Energy(Random random) => random.Next(8) switch
    {
        0 => double.NaN,
        1 => double.PositiveInfinity,
        2 => double.MaxValue,
        3 => double.Epsilon,
        _ => (random.NextDouble() - 0.5) * 20,
    };

    private static string System(Random random)
    {
        string[] parts = ["Li", "Co", "O", "Xx", "", "li", "Ni", "Og", " Li "];
        return string.Join(random.Next(5) == 0 ? "," : "-", Enumerable.Range(0, random.Next(0, 10)).Select(_ => parts[random.Next(parts.Length)]));
    }

    private static string Formula(Random random)
    {
        switch (random.Next(8))
        {
            case 0: return new string('(', random.Next(1, 200)) + "Li" + new string(')', random.Next(0, 200));
            case 1: return "Li" + new string('9', random.Next(1, 40)) + "O";
            case 2: return "Li0.000000000000000000001CoO2";
            case 3: return Text(random, 30);
            case 4: return string.Concat(Enumerable.Range(0, random.Next(1, 20)).Select(_ => new[] { "Li", "Co", "O", "Mn", "Ni", "Fe", "Zr", "U", "Og", "H" }[random.Next(10)] + random.Next(0, 5)));
            case 5: return "LiCoO2·" + random.Next(-3, 1000) + "H2O";
            default:
                string alphabet = "LiCoONMnAl0123456789.()[]/ *·";
                return new string(Enumerable.Range(0, random.Next(0, 25)).Select(_ => alphabet[random.Next(alphabet.Length)]).ToArray());
        }
    }

    private static string Text(Random random, int maxLength)
    {
        var text = new StringBuilder();
        for (int k = random.Next(0, maxLength); k > 0; k--)
        {
            text.Append(random.Next(6) switch
            {
                0 => (char)random.Next(0, 32),
                1 => (char)random.Next(0xD800, 0xE000),
                2 => (char)random.Next(0x80, 0x3000),
                _ => (char)random.Next(32, 127),
            });
        }

        return text.ToString();
    }
}
