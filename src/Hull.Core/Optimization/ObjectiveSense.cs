namespace Hull.Core.Optimization;

/// <summary>Whether a linear program's objective is to be made as small or as large as possible.</summary>
public enum ObjectiveSense
{
    Minimize,
    Maximize,
}
