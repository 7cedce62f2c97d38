using System.Collections.Concurrent;
using Hull.Core.Defects;

namespace Hull.Server.Defects;

/// <summary>
/// Checked studies by the SHA-256 of their two texts: reading a study works out every charge state's correction
/// (Ewald sums, model potentials at the alignment sites), which costs far more than the answers built on it, and a
/// stored study version never changes. Equal texts are the same study, so the content is the key.
/// </summary>
public sealed class DefectStudyCache
{
    /// <summary>Studies kept: the few being queried at once (each holds its charge states and corrections).</summary>
    private const int MaxStudies = 32;

    private readonly ConcurrentDictionary<string, Lazy<DefectStudy>> _studies = new(StringComparer.Ordinal);

    /// <summary>The study of the texts whose fingerprint is <paramref name="contentSha256"/>, read once.</summary>
    /// <exception cref="DefectInputException">The texts cannot be read (not kept, so a later call reads them afresh).</exception>
    public DefectStudy Get(string contentSha256, string studyJson, string chargeStatesCsv)
    {
        if (_studies.Count >= MaxStudies) _studies.Clear();
        var slot = _studies.GetOrAdd(contentSha256, _ => new Lazy<DefectStudy>(() => DefectStudyFile.Read(studyJson, chargeStatesCsv), LazyThreadSafetyMode.ExecutionAndPublication));
        try
        {
            return slot.Value;
        }
        catch (DefectInputException)
        {
            _studies.TryRemove(contentSha256, out _);
            throw;
        }
    }
}
