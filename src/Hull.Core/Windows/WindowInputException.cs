namespace Hull.Core.Windows;

/// <summary>What part of a window question was wrong.</summary>
public enum WindowInputSubject
{
    /// <summary>The compound (unknown, or not of the hull's system).</summary>
    Compound,

    /// <summary>The dopant element.</summary>
    Dopant,

    /// <summary>A fixed potential of a slice.</summary>
    Slice,

    /// <summary>An option (tolerance, lowering, projection).</summary>
    Option,

    /// <summary>An axis of a window map (an element outside the system, or the same element twice).</summary>
    MapAxis,
}

/// <summary>A window question that cannot be answered as asked; the message says what and where.</summary>
public sealed class WindowInputException : ArgumentException
{
    public WindowInputException(string message, WindowInputSubject subject, string? element = null)
        : base(message)
    {
        Subject = subject;
        Element = element;
    }

    /// <summary>Which input was at fault.</summary>
    public WindowInputSubject Subject { get; }

    /// <summary>The element concerned, when one is.</summary>
    public string? Element { get; }
}
