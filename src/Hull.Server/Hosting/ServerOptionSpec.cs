namespace Hull.Server.Hosting;

/// <summary>One server option as help shows it: "--port N  TCP port ...".</summary>
/// <param name="Name">The option, e.g. "--port".</param>
/// <param name="ValueName">What its value is, e.g. "N" or "DIR".</param>
/// <param name="Description">What it does, with its default.</param>
public sealed record ServerOptionSpec(string Name, string ValueName, string Description);
