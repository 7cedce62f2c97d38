namespace Hull.Core.Figures;

/// <summary>What the horizontal axis of a carrier figure varies: its name and unit (e.g. "Temperature", "K").</summary>
public sealed record CarrierFigureAxis(string Name, string Unit)
{
    public static CarrierFigureAxis Temperature { get; } = new("Temperature", "K");

    /// <summary>The fraction of the way along a straight path between two chemical-potential points.</summary>
    public static CarrierFigureAxis Path(string fromLabel, string toLabel) => new($"Position from {fromLabel} to {toLabel}", "fraction of the way");

    public string Title => $"{Name} ({Unit})";
}
