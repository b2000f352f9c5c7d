using System.Data;
using System.Data.Common;

namespace BarrierLedger.Ledger.Storage;

/// <summary>Helpers for the few hand-written statements (bulk inserts, the derivation upsert) that run on SQLite and PostgreSQL alike.</summary>
internal static class StoreSql
{
    /// <summary>Adds a named parameter with its type: PostgreSQL needs the type of a parameter that is NULL or stands in a SELECT list.</summary>
    public static DbParameter Parameter(DbCommand command, string name, DbType type)
    {
        var p = command.CreateParameter();
        p.ParameterName = name;
        p.DbType = type;
        command.Parameters.Add(p);
        return p;
    }
}
