namespace Hull.Store.Sqlite;

/// <summary>One ordered step of the schema: run once, inside the transaction that records it in schema_version.</summary>
/// <param name="Version">The schema version this step produces (steps are numbered in increasing order).</param>
/// <param name="Description">What the step changes, recorded beside the version.</param>
/// <param name="Sql">The statements of the step.</param>
internal sealed record Migration(int Version, string Description, string Sql)
{
    /// <summary>
    /// The first step that comes after <paramref name="current"/>, found by number rather than by place in the list,
    /// so that steps written on separate branches stay correct whichever is numbered first in the list.
    /// </summary>
    /// <exception cref="InvalidOperationException">The steps are not in strictly increasing order, or none follows.</exception>
    public static Migration NextAfter(IReadOnlyList<Migration> steps, long current)
    {
        for (int i = 1; i < steps.Count; i++)
        {
            if (steps[i].Version <= steps[i - 1].Version)
            {
                throw new InvalidOperationException($"schema step {steps[i].Version} is listed after step {steps[i - 1].Version}");
            }
        }
        return steps.FirstOrDefault(s => s.Version > current)
            ?? throw new InvalidOperationException($"no schema step follows version {current}");
    }
}
