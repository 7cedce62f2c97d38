namespace Hull.Store;

/// <summary>
/// How a derived version was made from a source version by a recipe. The Store keeps the texts as given and does not
/// interpret them: the server writes and reads the recipe and the per-step counts.
/// </summary>
/// <param name="SourceDataset">The dataset the source version belongs to.</param>
/// <param name="SourceVersion">The version the recipe ran on (1 or more).</param>
/// <param name="SourceSha256">The source version's content fingerprint when the recipe ran.</param>
/// <param name="RecipeJson">The recipe file's text, as the server reads it back.</param>
/// <param name="StepsJson">Each step's kind, parameters and counts, as the server wrote them.</param>
public sealed record CurationRecord(string SourceDataset, long SourceVersion, string SourceSha256, string RecipeJson, string StepsJson);
