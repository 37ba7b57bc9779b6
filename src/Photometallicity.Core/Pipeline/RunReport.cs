using Microsoft.Extensions.Logging;

namespace Photometallicity.Pipeline;

/// <summary>Writes the figures and the summary page of a run (plots/ and summary.html).</summary>
public static class RunReport
{
    public static IReadOnlyList<string> Write(PipelineResult r, string directory, ILogger log)
    {
        return [];
    }
}
