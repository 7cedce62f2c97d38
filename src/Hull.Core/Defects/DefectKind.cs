namespace Hull.Core.Defects;

/// <summary>What a defect is; the kind constrains which atoms it may add and remove.</summary>
public enum DefectKind
{
    /// <summary>Host atoms removed, none added.</summary>
    Vacancy = 0,

    /// <summary>Atoms added, none removed.</summary>
    Interstitial = 1,

    /// <summary>Host atoms exchanged between sublattices: host elements only, as many added as removed.</summary>
    Antisite = 2,

    /// <summary>A host atom replaced by an atom of another element (a dopant or impurity): as many added as removed.</summary>
    Substitution = 3,

    /// <summary>Two or more of the above bound together; its atoms are the sum of its constituents'.</summary>
    Complex = 4,
}
