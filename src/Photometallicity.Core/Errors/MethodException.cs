namespace Photometallicity.Errors;

/// <summary>
/// The data and the method do not fit (too few standards, a degenerate colour range, no stars to fit).
/// Exit code 2: the user must change the input, not the program. The message gives the counts.
/// </summary>
public sealed class MethodException : PhotometallicityException
{
    public MethodException(string message, Exception? inner = null) : base(message, inner) { }

    public override int ExitCode => 2;
}
