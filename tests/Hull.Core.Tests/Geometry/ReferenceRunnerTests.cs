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
}
