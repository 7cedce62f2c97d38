using Npgsql;
using NpgsqlTypes;

namespace Hull.Store.Postgres;

/// <summary>Short forms for building commands inside a transaction (parameters are named @name).</summary>
internal static class PostgresCommandExtensions
{
    public static NpgsqlCommand Command(this NpgsqlConnection connection, NpgsqlTransaction? transaction, string sql) =>
        new(sql, connection, transaction);

    public static NpgsqlCommand With(this NpgsqlCommand command, string name, object value)
    {
        command.Parameters.AddWithValue(name, value);
        return command;
    }

    /// <summary>A bigint parameter that may be null (PostgreSQL cannot infer the type of a bare null).</summary>
    public static NpgsqlCommand WithOptional(this NpgsqlCommand command, string name, long? value)
    {
        command.Parameters.Add(new NpgsqlParameter(name, NpgsqlDbType.Bigint) { Value = value is long v ? v : DBNull.Value });
        return command;
    }

    public static int Execute(this NpgsqlConnection connection, NpgsqlTransaction transaction, string sql, params (string Name, object Value)[] parameters)
    {
        using NpgsqlCommand command = connection.Command(transaction, sql);
        foreach ((string name, object value) in parameters) command.With(name, value);
        return command.ExecuteNonQuery();
    }
}
