using System.Net;
using Hull.Server.Cluster;
using Hull.Store.Tests.Backends;
using Npgsql;
using Orleans;
using Orleans.Runtime;

namespace Hull.Server.Tests;

/// <summary>
/// The membership table against the contract Orleans documents for <see cref="IMembershipTable"/> (its XML
/// documentation: inserts and updates are atomic with the table version, fail on a stale version etag, an insert
/// fails for a member already present and an update for one absent; a heartbeat leaves the version alone; reads
/// give back what was written), on the test PostgreSQL.
/// </summary>
public sealed class MembershipTableTests
{
    [Fact]
    public async Task Changes_need_the_current_version_etag_and_reads_give_back_what_was_written()
    {
        await using NpgsqlDataSource source = NpgsqlDataSource.Create(PostgresTestCluster.NewSchema("members"));
        var table = new PostgresMembershipTable(source, "c1");
        await table.InitializeMembershipTable(tryInitTableVersion: true);
        await table.InitializeMembershipTable(tryInitTableVersion: true); // a second member starting: no change

        MembershipTableData empty = await table.ReadAll();
        Assert.Empty(empty.Members);
        SiloAddress a = SiloAddress.New(IPAddress.Loopback, 7001, 1), b = SiloAddress.New(IPAddress.Loopback, 7002, 2);
        MembershipEntry first = Entry(a, SiloStatus.Joining);
        Assert.True(await table.InsertRow(first, empty.Version.Next()));
        Assert.False(await table.InsertRow(Entry(b, SiloStatus.Joining), empty.Version.Next()));   // stale etag
        MembershipTableData one = await table.ReadAll();
        Assert.False(await table.InsertRow(Entry(a, SiloStatus.Joining), one.Version.Next()));     // already there
        Assert.Equal(1, one.Version.Version);

        MembershipEntry active = Entry(a, SiloStatus.Active);
        active.SuspectTimes = [Tuple.Create(b, new DateTime(2026, 1, 2, 3, 4, 5, DateTimeKind.Utc))];
        string etag = one.Members[0].Item2;
        Assert.False(await table.UpdateRow(Entry(b, SiloStatus.Active), etag, one.Version.Next()));   // no such member
        Assert.True(await table.UpdateRow(active, etag, one.Version.Next()));
        Assert.False(await table.UpdateRow(active, etag, one.Version.Next()));                        // stale etag

        active.IAmAliveTime = active.IAmAliveTime.AddSeconds(30);
        await table.UpdateIAmAlive(active);
        MembershipTableData read = await table.ReadRow(a);
        Assert.Equal(2, read.Version.Version);
        MembershipEntry back = Assert.Single(read.Members).Item1;
        Assert.Equal((a, SiloStatus.Active, "silo-7001", "host", 7101, active.StartTime, active.IAmAliveTime),
            (back.SiloAddress, back.Status, back.SiloName, back.HostName, back.ProxyPort, back.StartTime, back.IAmAliveTime));
        Assert.Equal(active.SuspectTimes, back.SuspectTimes);

        // Another cluster in the same tables sees none of it; deleting it leaves this one alone.
        var other = new PostgresMembershipTable(source, "c2");
        await other.InitializeMembershipTable(tryInitTableVersion: true);
        Assert.Empty((await other.ReadAll()).Members);
        await other.DeleteMembershipTableEntries("c2");
        Assert.Single((await table.ReadAll()).Members);
    }

    [Fact]
    public async Task Cleanup_removes_only_members_dead_before_the_date()
    {
        await using NpgsqlDataSource source = NpgsqlDataSource.Create(PostgresTestCluster.NewSchema("members"));
        var table = new PostgresMembershipTable(source, "c1");
        await table.InitializeMembershipTable(tryInitTableVersion: true);
        SiloAddress dead = SiloAddress.New(IPAddress.Loopback, 7001, 1), alive = SiloAddress.New(IPAddress.Loopback, 7002, 2);
        Assert.True(await table.InsertRow(Entry(dead, SiloStatus.Dead), (await table.ReadAll()).Version.Next()));
        Assert.True(await table.InsertRow(Entry(alive, SiloStatus.Active), (await table.ReadAll()).Version.Next()));

        await table.CleanupDefunctSiloEntries(new DateTimeOffset(2026, 1, 1, 0, 0, 0, TimeSpan.Zero)); // before both
        Assert.Equal(2, (await table.ReadAll()).Members.Count);
        await table.CleanupDefunctSiloEntries(DateTimeOffset.UtcNow.AddDays(1));
        Assert.Equal(alive, Assert.Single((await table.ReadAll()).Members).Item1.SiloAddress);
    }

    private static MembershipEntry Entry(SiloAddress address, SiloStatus status) => new()
    {
        SiloAddress = address,
        Status = status,
        SiloName = $"silo-{address.Endpoint.Port}",
        HostName = "host",
        RoleName = "hull",
        ProxyPort = address.Endpoint.Port + 100,
        StartTime = new DateTime(2026, 3, 1, 12, 0, 0, DateTimeKind.Utc),
        IAmAliveTime = new DateTime(2026, 3, 1, 12, 0, 10, DateTimeKind.Utc),
        SuspectTimes = [],
    };
}
