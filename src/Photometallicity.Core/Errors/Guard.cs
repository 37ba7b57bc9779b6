namespace Photometallicity.Errors;

/// <summary>Preconditions for trusted inner code: violations are programming errors (exit code 1).</summary>
public static class Guard
{
    public static void InRange(double value, double min, double max, string name)
    {
        if (!(value >= min && value <= max))
            throw new ArgumentOutOfRangeException(name, value, $"{name} = {value} is outside [{min}, {max}].");
    }

    public static void SameLength(int a, int b, string nameA, string nameB)
    {
        if (a != b) throw new ArgumentException($"{nameA} has {a} elements but {nameB} has {b}.");
    }
}
