namespace Hull.Cli.Output;

/// <summary>How results are printed: an aligned table for people (default), JSON or CSV for programs.</summary>
public enum OutputFormat
{
    Table,
    Json,
    Csv,
}
