using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>Short forms for building commands inside a transaction.</summary>
internal static class CommandExtensions
{
    public static SqliteCommand Command(this SqliteConnection connection, SqliteTransaction transaction, string sql)
    {
        SqliteCommand command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = sql;
        return command;
    }

    public static SqliteCommand With(this SqliteCommand command, string name, object? value)
    {
        command.Parameters.AddWithValue(name, value ?? DBNull.Value);
        return command;
    }
}
