namespace Hull.Core.Figures;

/// <summary>What a formation-energy-against-Fermi-level figure shows.</summary>
/// <param name="HostFormula">The host, e.g. "Al2O3".</param>
/// <param name="PointLabel">The chemical-potential point in words, e.g. "window vertex 2 (with O)", "O2 at 1273 K, 0.21 bar", "given point".</param>
/// <param name="PointDescription">Its Δμ values in words, e.g. "Δμ(Al) = −8.58 eV, Δμ(O) = 0 eV".</param>
/// <param name="BandGapEv">The host's band gap (the CBM above the VBM), eV.</param>
/// <param name="FermiMinEv">Left end of the Fermi-level axis, eV above the VBM.</param>
/// <param name="FermiMaxEv">Right end, eV above the VBM.</param>
/// <param name="Lines">The defects, in legend order.</param>
/// <param name="Metadata">The dataset version the references and point came from.</param>
/// <param name="StudyName">The study's name.</param>
/// <param name="StudyVersion">The study's version.</param>
public sealed record DefectFigureInput(
    string HostFormula,
    string PointLabel,
    string PointDescription,
    double BandGapEv,
    double FermiMinEv,
    double FermiMaxEv,
    IReadOnlyList<DefectFigureLine> Lines,
    FigureMetadata Metadata,
    string StudyName,
    long StudyVersion);
