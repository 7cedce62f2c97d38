using System.Globalization;
using Npgsql;

namespace Hull.Server.Cluster;

/// <summary>
/// The cluster's membership table (who is in the cluster, and in which state) in PostgreSQL: one row per member
/// and one version row per cluster, which every change moves on. A change takes the version row's lock and checks
/// its etag first, so of two members that read the same version only one may change the table.
/// </summary>
internal sealed class PostgresMembershipTable(NpgsqlDataSource source, string clusterId) : IMembershipTable
{
    public async Task InitializeMembershipTable(bool tryInitTableVersion)
    {
        await using NpgsqlConnection connection = await source.OpenConnectionAsync();
        await MembershipTableSchema.CreateAsync(connection, source.ConnectionString);
        if (!tryInitTableVersion) return;
        await using NpgsqlCommand init = Command(connection, null,
            "INSERT INTO cluster_membership_versions (cluster_id, version, etag) VALUES (@cluster, 0, 0) ON CONFLICT DO NOTHING");
        await init.ExecuteNonQueryAsync();
    }

    public async Task DeleteMembershipTableEntries(string clusterId)
    {
        await using NpgsqlConnection connection = await source.OpenConnectionAsync();
        await using NpgsqlTransaction transaction = await connection.BeginTransactionAsync();
        foreach (string table in new[] { "cluster_members", "cluster_membership_versions" })
        {
            await using NpgsqlCommand delete = new($"DELETE FROM {table} WHERE cluster_id = @cluster", connection, transaction);
            delete.Parameters.AddWithValue("cluster", clusterId);
            await delete.ExecuteNonQueryAsync();
        }

        await transaction.CommitAsync();
    }

    public async Task CleanupDefunctSiloEntries(DateTimeOffset beforeDate)
    {
        await using NpgsqlConnection connection = await source.OpenConnectionAsync();
        await using NpgsqlCommand delete = Command(connection, null,
            "DELETE FROM cluster_members WHERE cluster_id = @cluster AND status = @dead AND last_update_time < @before");
        delete.Parameters.AddWithValue("dead", (int)SiloStatus.Dead);
        delete.Parameters.AddWithValue("before", beforeDate.UtcDateTime);
        await delete.ExecuteNonQueryAsync();
    }

    public Task<MembershipTableData> ReadRow(SiloAddress key) => ReadAsync(key);

    public Task<MembershipTableData> ReadAll() => ReadAsync(null);

    public Task<bool> InsertRow(MembershipEntry entry, TableVersion tableVersion) => ChangeAsync(tableVersion, async (connection, transaction) =>
    {
        await using NpgsqlCommand insert = Command(connection, transaction,
            "INSERT INTO cluster_members (cluster_id, address, silo_name, host_name, role_name, status, proxy_port, update_zone, fault_zone, " +
            "start_time, i_am_alive_time, last_update_time, suspect_times, row_etag) VALUES (@cluster, @address, @silo_name, @host_name, @role_name, " +
            "@status, @proxy_port, @update_zone, @fault_zone, @start_time, @i_am_alive_time, @last_update_time, @suspect_times, 0) ON CONFLICT DO NOTHING");
        WithEntry(insert, entry);
        return await insert.ExecuteNonQueryAsync() == 1;
    });

    // The row's etag is not compared: the table's etag already orders every change, and a heartbeat leaves both alone.
    public Task<bool> UpdateRow(MembershipEntry entry, string etag, TableVersion tableVersion) => ChangeAsync(tableVersion, async (connection, transaction) =>
    {
        await using NpgsqlCommand update = Command(connection, transaction,
            "UPDATE cluster_members SET silo_name = @silo_name, host_name = @host_name, role_name = @role_name, status = @status, " +
            "proxy_port = @proxy_port, update_zone = @update_zone, fault_zone = @fault_zone, start_time = @start_time, " +
            "i_am_alive_time = @i_am_alive_time, last_update_time = @last_update_time, suspect_times = @suspect_times, row_etag = row_etag + 1 " +
            "WHERE cluster_id = @cluster AND address = @address");
        WithEntry(update, entry);
        return await update.ExecuteNonQueryAsync() == 1;
    });

    public async Task UpdateIAmAlive(MembershipEntry entry)
    {
        await using NpgsqlConnection connection = await source.OpenConnectionAsync();
        await using NpgsqlCommand update = Command(connection, null,
            "UPDATE cluster_members SET i_am_alive_time = @alive, last_update_time = greatest(last_update_time, @alive) " +
            "WHERE cluster_id = @cluster AND address = @address");
        update.Parameters.AddWithValue("alive", Utc(entry.IAmAliveTime));
        update.Parameters.AddWithValue("address", entry.SiloAddress.ToParsableString());
        await update.ExecuteNonQueryAsync();
    }

    private async Task<MembershipTableData> ReadAsync(SiloAddress? only)
    {
        await using NpgsqlConnection connection = await source.OpenConnectionAsync();
        // One snapshot for the version and the rows, as the table's readers require.
        await using NpgsqlTransaction transaction = await connection.BeginTransactionAsync(System.Data.IsolationLevel.RepeatableRead);
        TableVersion version = new(0, "0");
        await using (NpgsqlCommand read = Command(connection, transaction, "SELECT version, etag FROM cluster_membership_versions WHERE cluster_id = @cluster"))
        await using (NpgsqlDataReader row = await read.ExecuteReaderAsync())
        {
            if (await row.ReadAsync()) version = new TableVersion(row.GetInt32(0), row.GetInt64(1).ToString(CultureInfo.InvariantCulture));
        }

        var members = new List<Tuple<MembershipEntry, string>>();
        string sql = "SELECT address, silo_name, host_name, role_name, status, proxy_port, update_zone, fault_zone, start_time, i_am_alive_time, " +
                     "suspect_times, row_etag FROM cluster_members WHERE cluster_id = @cluster" + (only is null ? string.Empty : " AND address = @address");
        await using (NpgsqlCommand read = Command(connection, transaction, sql))
        {
            if (only is not null) read.Parameters.AddWithValue("address", only.ToParsableString());
            await using NpgsqlDataReader row = await read.ExecuteReaderAsync();
            while (await row.ReadAsync())
            {
                var entry = new MembershipEntry
                {
                    SiloAddress = SiloAddress.FromParsableString(row.GetString(0)),
                    SiloName = row.GetString(1),
                    HostName = row.GetString(2),
                    RoleName = row.GetString(3),
                    Status = (SiloStatus)row.GetInt32(4),
                    ProxyPort = row.GetInt32(5),
                    UpdateZone = row.GetInt32(6),
                    FaultZone = row.GetInt32(7),
                    StartTime = row.GetFieldValue<DateTime>(8),
                    IAmAliveTime = row.GetFieldValue<DateTime>(9),
                    SuspectTimes = SuspectTimesText.Parse(row.GetString(10)),
                };
                members.Add(Tuple.Create(entry, row.GetInt64(11).ToString(CultureInfo.InvariantCulture)));
            }
        }

        await transaction.CommitAsync();
        return new MembershipTableData(members, version);
    }

    /// <summary>
    /// Runs <paramref name="change"/> only if the table's etag is still the one <paramref name="tableVersion"/> was
    /// read with, and moves the version on with it; false, with nothing changed, otherwise.
    /// </summary>
    private async Task<bool> ChangeAsync(TableVersion tableVersion, Func<NpgsqlConnection, NpgsqlTransaction, Task<bool>> change)
    {
        await using NpgsqlConnection connection = await source.OpenConnectionAsync();
        await using NpgsqlTransaction transaction = await connection.BeginTransactionAsync();
        await using (NpgsqlCommand current = Command(connection, transaction, "SELECT etag FROM cluster_membership_versions WHERE cluster_id = @cluster FOR UPDATE"))
        {
            if (await current.ExecuteScalarAsync() is not long etag || etag.ToString(CultureInfo.InvariantCulture) != tableVersion.VersionEtag)
            {
                await transaction.RollbackAsync();
                return false;
            }
        }

        if (!await change(connection, transaction))
        {
            await transaction.RollbackAsync();
            return false;
        }

        await using (NpgsqlCommand next = Command(connection, transaction,
            "UPDATE cluster_membership_versions SET version = @version, etag = etag + 1 WHERE cluster_id = @cluster"))
        {
            next.Parameters.AddWithValue("version", tableVersion.Version);
            await next.ExecuteNonQueryAsync();
        }

        await transaction.CommitAsync();
        return true;
    }

    private NpgsqlCommand Command(NpgsqlConnection connection, NpgsqlTransaction? transaction, string sql)
    {
        var command = new NpgsqlCommand(sql, connection, transaction);
        command.Parameters.AddWithValue("cluster", clusterId);
        return command;
    }

    private static void WithEntry(NpgsqlCommand command, MembershipEntry entry)
    {
        command.Parameters.AddWithValue("address", entry.SiloAddress.ToParsableString());
        command.Parameters.AddWithValue("silo_name", entry.SiloName ?? string.Empty);
        command.Parameters.AddWithValue("host_name", entry.HostName ?? string.Empty);
        command.Parameters.AddWithValue("role_name", entry.RoleName ?? string.Empty);
        command.Parameters.AddWithValue("status", (int)entry.Status);
        command.Parameters.AddWithValue("proxy_port", entry.ProxyPort);
        command.Parameters.AddWithValue("update_zone", entry.UpdateZone);
        command.Parameters.AddWithValue("fault_zone", entry.FaultZone);
        command.Parameters.AddWithValue("start_time", Utc(entry.StartTime));
        command.Parameters.AddWithValue("i_am_alive_time", Utc(entry.IAmAliveTime));
        command.Parameters.AddWithValue("last_update_time", LastUpdate(entry));
        command.Parameters.AddWithValue("suspect_times", SuspectTimesText.Format(entry.SuspectTimes));
    }

    // The latest of its start, its last heartbeat and its last suspicion: a member declared dead recently is kept a while.
    private static DateTime LastUpdate(MembershipEntry entry) =>
        new[] { Utc(entry.StartTime), Utc(entry.IAmAliveTime) }.Concat(entry.SuspectTimes?.Select(s => Utc(s.Item2)) ?? []).Max();

    // PostgreSQL's timestamptz takes UTC times only; the membership protocol's times are UTC already or unmarked.
    private static DateTime Utc(DateTime time) => time.Kind switch
    {
        DateTimeKind.Utc => time,
        DateTimeKind.Local => time.ToUniversalTime(),
        _ => DateTime.SpecifyKind(time, DateTimeKind.Utc),
    };
}
