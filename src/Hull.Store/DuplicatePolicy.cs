namespace Hull.Store;

/// <summary>What an import does with an id that the dataset's latest version already has.</summary>
public enum DuplicatePolicy
{
    /// <summary>The whole batch fails, naming the first offending row.</summary>
    Reject,

    /// <summary>The new version carries the batch's row for that id; earlier versions keep the old row.</summary>
    Replace,
}
