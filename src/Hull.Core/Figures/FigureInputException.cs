namespace Hull.Core.Figures;

/// <summary>A figure that cannot be drawn as asked (too many components, a bad view or cut-off); the message says why.</summary>
public sealed class FigureInputException(string message, string parameter) : ArgumentException(message, parameter);
