namespace Photometallicity.Errors;

/// <summary>
/// Base of the project's own failures. The CLI maps <see cref="ExitCode"/> to the process exit code:
/// 2 for bad input or a data set the method cannot handle, 1 for anything internal.
/// </summary>
public abstract class PhotometallicityException : Exception
{
    protected PhotometallicityException(string message, Exception? inner = null) : base(message, inner) { }

    /// <summary>Process exit code this failure maps to.</summary>
    public abstract int ExitCode { get; }
}
