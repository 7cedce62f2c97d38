using System.Net;

namespace Hull.Server.Cluster;

/// <summary>
/// How a server joins a cluster of servers that share hull work: each chemical system's hull of a version lives on
/// one server of the cluster. Null in <see cref="Hosting.HullServerOptions.Cluster"/> (the default): the server
/// works alone, as without a cluster. The members must share one store (PostgreSQL), since any of them may answer
/// for a system's hull.
/// </summary>
/// <param name="ClusterName">Servers with the same name (and membership database) form one cluster.</param>
/// <param name="PeerPort">Port on which this server talks to its peers.</param>
/// <param name="GatewayPort">Port on which the cluster's own clients (not the gRPC callers) reach this server.</param>
/// <param name="MembershipConnectionString">The PostgreSQL database (Npgsql connection string) holding the
/// membership tables, created there by the first member; usually the store's own.</param>
public sealed record ClusterSettings(string ClusterName, int PeerPort, int GatewayPort, string MembershipConnectionString)
{
    /// <summary>The address peers reach this server at (loopback unless the cluster spans machines).</summary>
    public IPAddress PeerAddress { get; init; } = IPAddress.Loopback;
}
