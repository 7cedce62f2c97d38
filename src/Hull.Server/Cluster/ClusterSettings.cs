namespace Hull.Server.Cluster;

/// <summary>
/// How a server joins a cluster of servers that share hull work: each chemical system's hull of a version lives on
/// one server of the cluster. Null in <see cref="Hosting.HullServerOptions.Cluster"/> (the default): the server
/// works alone, as without a cluster.
/// </summary>
/// <param name="ClusterName">Servers with the same name form one cluster.</param>
/// <param name="PeerPort">Port on which this server talks to its peers; 0 picks a free one.</param>
public sealed record ClusterSettings(string ClusterName, int PeerPort);
