using Microsoft.Data.Sqlite;

namespace Hull.Store.Tests;

/// <summary>Plain SQLite access to a store's file, past the store, for tests that build or inspect the file itself.</summary>
internal static class RawDatabase
{
    public static SqliteConnection Open(string databasePath, bool create = false)
    {
        var connection = new SqliteConnection(new SqliteConnectionStringBuilder
        {
            DataSource = databasePath,
            Mode = create ? SqliteOpenMode.ReadWriteCreate : SqliteOpenMode.ReadWrite,
            Pooling = false,
        }.ToString());
        connection.Open();
        return connection;
    }

    public static void Execute(SqliteConnection connection, string sql)
    {
        using SqliteCommand command = connection.CreateCommand();
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }

    public static List<T> Column<T>(SqliteConnection connection, string sql)
    {
        using SqliteCommand command = connection.CreateCommand();
        command.CommandText = sql;
        using SqliteDataReader reader = command.ExecuteReader();
        var values = new List<T>();
        while (reader.Read()) values.Add(reader.GetFieldValue<T>(0));
        return values;
    }
}
