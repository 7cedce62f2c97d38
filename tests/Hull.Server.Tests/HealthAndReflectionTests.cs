using Google.Protobuf;
using Google.Protobuf.Reflection;
using Grpc.Core;
using Grpc.Health.V1;
using Grpc.Reflection.V1Alpha;
using Hull.Store;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// The standard gRPC health checking and server reflection services, used through their own standard clients
/// (Grpc.HealthCheck, Grpc.Reflection), as any generic gRPC tool would.
/// </summary>
public sealed class HealthAndReflectionTests
{
    [Fact]
    public async Task Health_is_serving_only_while_the_store_is_usable()
    {
        await using var s = await RunningServer.StartAsync();
        var health = new Health.HealthClient(s.Clients.Channel);
        Assert.Equal(HealthCheckResponse.Types.ServingStatus.Serving, (await health.CheckAsync(new HealthCheckRequest(), s.Clients.Call())).Status);

        // Take the database file away: the store is no longer usable, and the check says so on the next call.
        string database = ((DatasetStore)s.Server.Store).DatabasePath;
        File.Move(database, database + ".moved");
        Assert.Equal(HealthCheckResponse.Types.ServingStatus.NotServing, (await health.CheckAsync(new HealthCheckRequest(), s.Clients.Call())).Status);

        File.Move(database + ".moved", database);
        Assert.Equal(HealthCheckResponse.Types.ServingStatus.Serving, (await health.CheckAsync(new HealthCheckRequest(), s.Clients.Call())).Status);
    }

    [Fact]
    public async Task Reflection_lists_the_services_and_describes_their_methods()
    {
        await using var s = await RunningServer.StartAsync();
        var reflection = new ServerReflection.ServerReflectionClient(s.Clients.Channel);
        using var call = reflection.ServerReflectionInfo(s.Clients.Call());

        await call.RequestStream.WriteAsync(new ServerReflectionRequest { ListServices = string.Empty });
        Assert.True(await call.ResponseStream.MoveNext());
        string[] services = call.ResponseStream.Current.ListServicesResponse.Service.Select(x => x.Name).ToArray();
        Assert.Contains("hull.v1.DatasetService", services);
        Assert.Contains("hull.v1.StabilityService", services);
        Assert.Contains("hull.v1.DiagnosticsService", services);
        Assert.Contains("hull.v1.ElectrochemistryService", services);
        Assert.Contains("hull.v1.ThermoService", services);
        Assert.Contains("grpc.health.v1.Health", services);

        await call.RequestStream.WriteAsync(new ServerReflectionRequest { FileContainingSymbol = "hull.v1.StabilityService" });
        Assert.True(await call.ResponseStream.MoveNext());
        var files = call.ResponseStream.Current.FileDescriptorResponse.FileDescriptorProto
            .Select(bytes => FileDescriptorProto.Parser.ParseFrom(bytes)).ToArray();
        FileDescriptorProto stability = files.Single(f => f.Name == "hull/v1/stability.proto");
        Assert.Equal("hull.v1", stability.Package);
        string[] methods = stability.Service.Single().Method.Select(m => m.Name).ToArray();
        Assert.Equal(["GetEntryStability", "AssessCandidates", "GetHullEnergies", "GetStablePhases", "GetHullFacets", "AnalyzeDataset"], methods);
        await call.RequestStream.CompleteAsync();
    }
}
