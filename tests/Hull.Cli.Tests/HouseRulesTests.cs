using System.Reflection;
using System.Reflection.Metadata;
using System.Reflection.PortableExecutable;

namespace Hull.Cli.Tests;

/// <summary>
/// The house's dependency rules, read from the built assemblies: Cli -> protos (and the server host, for `hull
/// serve` and `hull demo` only); Server -> Core, Store, protos; Store -> nothing of ours; Core -> nothing. Assembly
/// references catch a project reference or package; type references catch I/O reached through the runtime's own
/// assemblies, which every project references anyway. This project is the one that loads all five assemblies.
/// </summary>
public sealed class HouseRulesTests
{
    private static readonly Assembly Core = typeof(Hull.Core.Chemistry.Composition).Assembly;
    private static readonly Assembly Store = typeof(Hull.Store.DatasetStore).Assembly;
    private static readonly Assembly Server = typeof(Hull.Server.Hosting.HullServer).Assembly;
    private static readonly Assembly Protos = typeof(Hull.Protos.V1.Entry).Assembly;
    private static readonly Assembly Cli = typeof(Hull.Cli.CliApp).Assembly;

    // I/O, networking, gRPC, protobuf, databases and hosting: none belongs in the science layer.
    private static readonly string[] InfrastructurePrefixes =
    [
        "Grpc", "Google.", "Microsoft.Data", "Microsoft.AspNetCore", "Microsoft.Extensions", "SQLitePCL", "System.Data",
        "System.Net", "System.IO", "System.Console", "System.Diagnostics.Process", "System.Text.Json", "System.Xml",
        "System.CommandLine",
    ];

    // Type namespaces (and single types) that do I/O although they live in the runtime's core assembly.
    private static readonly string[] InfrastructureTypes =
    [
        "System.IO.", "System.Net.", "System.Console", "System.Diagnostics.Process", "System.Data.", "System.Environment.GetEnvironmentVariable",
    ];

    [Fact]
    public void CoreReferencesNothingOfOursAndNoInfrastructure()
    {
        Assert.Empty(OurReferences(Core));
        Assert.Empty(ReferencesStartingWith(Core, InfrastructurePrefixes));
        Assert.Empty(TypeReferencesIn(Core, InfrastructureTypes));
    }

    [Fact]
    public void StoreReferencesNothingOfOurs()
    {
        Assert.Empty(OurReferences(Store));
        Assert.Empty(ReferencesStartingWith(Store, ["Grpc", "Google.", "Microsoft.AspNetCore"]));
    }

    [Fact]
    public void ServerReferencesCoreStoreAndProtosButNotTheClient()
    {
        Assert.Equal(["Hull.Core", "Hull.Protos", "Hull.Store"], OurReferences(Server));
    }

    [Fact]
    public void ClientComputesNothingItself()
    {
        // The client reaches the server host (for `hull serve` and `hull demo`) but never Core or the Store directly.
        Assert.Equal(["Hull.Protos", "Hull.Server"], OurReferences(Cli));
        Assert.Empty(OurReferences(Protos));
    }

    [Fact]
    public void TheChecksSeeWhatTheyLookFor()
    {
        // The Store does database I/O, so the checks must find it there; otherwise they could pass on anything.
        Assert.NotEmpty(ReferencesStartingWith(Store, InfrastructurePrefixes));
        Assert.NotEmpty(TypeReferencesIn(Store, InfrastructureTypes));
        Assert.Contains("Hull.Core", OurReferences(Server));
    }

    private static string[] OurReferences(Assembly assembly) =>
        assembly.GetReferencedAssemblies().Select(a => a.Name!).Where(n => n.StartsWith("Hull.", StringComparison.Ordinal))
            .Order(StringComparer.Ordinal).ToArray();

    private static string[] ReferencesStartingWith(Assembly assembly, string[] prefixes) =>
        assembly.GetReferencedAssemblies().Select(a => a.Name!)
            .Where(n => prefixes.Any(p => n.StartsWith(p, StringComparison.Ordinal))).Order(StringComparer.Ordinal).ToArray();

    /// <summary>Referenced types (and members) whose full name starts with one of <paramref name="prefixes"/>.</summary>
    private static string[] TypeReferencesIn(Assembly assembly, string[] prefixes)
    {
        using var stream = File.OpenRead(assembly.Location);
        using var pe = new PEReader(stream);
        MetadataReader reader = pe.GetMetadataReader();
        var names = new SortedSet<string>(StringComparer.Ordinal);
        foreach (TypeReferenceHandle handle in reader.TypeReferences)
        {
            names.Add(FullName(reader, handle));
        }

        foreach (MemberReferenceHandle handle in reader.MemberReferences)
        {
            MemberReference member = reader.GetMemberReference(handle);
            if (member.Parent.Kind == HandleKind.TypeReference)
            {
                names.Add(FullName(reader, (TypeReferenceHandle)member.Parent) + "." + reader.GetString(member.Name));
            }
        }

        return names.Where(n => prefixes.Any(p => n.StartsWith(p, StringComparison.Ordinal))).ToArray();
    }

    private static string FullName(MetadataReader reader, TypeReferenceHandle handle)
    {
        TypeReference type = reader.GetTypeReference(handle);
        string name = reader.GetString(type.Name);
        if (type.ResolutionScope.Kind == HandleKind.TypeReference)
        {
            return FullName(reader, (TypeReferenceHandle)type.ResolutionScope) + "+" + name;
        }

        string ns = reader.GetString(type.Namespace);
        return ns.Length == 0 ? name : ns + "." + name;
    }
}
