using Photometallicity.Errors;

namespace Photometallicity.Tiling;

/// <summary>Refuses to go on when the config or the catalogues changed after the split.</summary>
public static class TilePlanChecks
{
    /// <summary>Compares the files' checksums now with the plan's (only the config when <paramref name="configOnly"/>).</summary>
    public static void RequireUnchanged(TilePlan plan, bool configOnly)
    {
        foreach (var (file, sha) in configOnly ? plan.Checksums.Take(1) : plan.Checksums)
        {
            if (!File.Exists(file)) throw new InputException("an input of the split is gone", file: file);
            if (Pipeline.Checksums.Sha256(file) != sha)
                throw new InputException("the file changed after the split (SHA-256 differs from plan.json's); run 'split' again", file: file);
        }
    }
}
