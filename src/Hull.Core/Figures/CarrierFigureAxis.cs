namespace Hull.Core.Figures;

/// <summary>What the horizontal axis of a carrier figure varies: its name and unit (e.g. "Temperature", "K").</summary>
public sealed record CarrierFigureAxis(string Name, string Unit)
{
    public static CarrierFigureAxis Temperature { get; } = new("Temperature", "K");

    public string Title => $"{Name} ({Unit})";
}
