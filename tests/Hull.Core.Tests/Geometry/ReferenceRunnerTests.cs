using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// The outside references must fail loudly, never skip: a missing tool, a tool error and a hung tool each raise
/// <see cref="ReferenceToolException"/> with a message that says what to fix.
/// </summary>
public sealed class ReferenceRunnerTests
{
    [Fact]
    public void Missing_tool_names_the_package_to_install()
    {
        var e = Assert.Throws<ReferenceToolException>(() =>
            ToolProcess.Run("hull-reference-tool-that-does-not-exist", [], Path.GetTempPath(), TimeSpan.FromSeconds(5), "some-package"));
        Assert.Contains("install the Debian package some-package", e.Message);
    }

    [Fact]
    public void Tool_error_is_reported_with_its_output()
    {
        // qconvex refuses a file that is not qhull input (qconvex manual: input starts with dimension and count).
        using var scratch = new ScratchFolder("bad-input");
        File.WriteAllText(scratch.File("bad.txt"), "not a point file\n");
        var e = Assert.Throws<ReferenceToolException>(() =>
            ToolProcess.Run("qconvex", ["TI", scratch.File("bad.txt")], scratch.Path, TimeSpan.FromSeconds(30), "qhull-bin"));
        Assert.Contains("exited with code", e.Message);
        Assert.Contains("qhull input error", e.Message);
    }

    [Fact]
    public void Hung_tool_is_stopped_at_the_timeout()
    {
        var e = Assert.Throws<ReferenceToolException>(() =>
            ToolProcess.Run("sleep", ["30"], Path.GetTempPath(), TimeSpan.FromMilliseconds(300), "coreutils"));
        Assert.Contains("did not finish within", e.Message);
    }

    [Fact]
    public void Scipy_lp_leaves_out_excluded_points()
    {
        // Worked by hand: A and B at 0 eV/atom, AB (1:1) at -0.4. At x = (1/2, 1/2) the hull energy is -0.4 (all atoms
        // in AB); with AB left out only A + B remain, half the atoms each, at 0.
        long[][] amounts = [[1, 0], [0, 1], [1, 1]];
        double[] energies = [0.0, 0.0, -0.4];
        double[][] queries = [[0.5, 0.5], [0.5, 0.5]];
        var answers = ScipyLpRunner.Solve(new HullLpProblem(amounts, energies, queries, [[], [2]]));
        // SciPy linprog HiGHS, Debian python3-scipy
        Assert.Equal(-0.4, answers[0].HullEnergyEvPerAtom, 9);
        Assert.Equal([2], answers[0].Phases);
        Assert.Equal(0.0, answers[1].HullEnergyEvPerAtom, 9);
        Assert.Equal([0, 1], answers[1].Phases.Order());
        Assert.Throws<ArgumentException>(() => GlpkLpRunner.Solve(new HullLpProblem(amounts, energies, queries, [[], [2]])));
    }
}
