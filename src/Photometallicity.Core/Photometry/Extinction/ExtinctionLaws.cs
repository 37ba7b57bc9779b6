using Photometallicity.Errors;

namespace Photometallicity.Photometry.Extinction;

/// <summary>The known extinction laws by name, and the checks user input must pass before a law is evaluated.</summary>
public static class ExtinctionLaws
{
    /// <summary>The law used when none is named.</summary>
    public const string DefaultName = "fitzpatrick99";

    /// <summary>R_V accepted by <see cref="CheckRv"/>: the laws' fits span roughly R_V = 2-6; we allow a margin.</summary>
    public const double MinRv = 1.5, MaxRv = 7.0;

    private static readonly IExtinctionLaw[] Known = [new CardelliClaytonMathis1989(), new ODonnell1994(), new Fitzpatrick1999()];

    /// <summary>The known names, comma separated, for messages and help texts.</summary>
    public static string KnownNames => string.Join(", ", Known.Select(l => l.Name));

    public static IReadOnlyList<IExtinctionLaw> All => Known;

    /// <summary>The law called <paramref name="name"/> (case-insensitive); InputException listing the known names otherwise.</summary>
    public static IExtinctionLaw FromName(string name, string? where = null)
    {
        foreach (var law in Known)
            if (string.Equals(law.Name, name?.Trim(), StringComparison.OrdinalIgnoreCase)) return law;
        throw new InputException(Prefix(where) + $"unknown extinction law '{name}'; known laws: {KnownNames}");
    }

    /// <summary>InputException unless R_V is finite and within [<see cref="MinRv"/>, <see cref="MaxRv"/>].</summary>
    public static void CheckRv(double rv, string? where = null)
    {
        if (!(rv >= MinRv && rv <= MaxRv))
            throw new InputException(Prefix(where) + $"R_V = {rv} is outside the range the extinction laws cover ({MinRv}-{MaxRv})");
    }

    /// <summary>InputException unless [minAngstrom, maxAngstrom] lies inside the law's domain.</summary>
    public static void CheckDomain(IExtinctionLaw law, double minAngstrom, double maxAngstrom, string? file = null)
    {
        if (minAngstrom < law.MinWavelengthAngstrom * (1 - 1e-12) || maxAngstrom > law.MaxWavelengthAngstrom * (1 + 1e-12))
            throw new InputException(
                $"wavelengths {minAngstrom:0.#}-{maxAngstrom:0.#} Angstrom fall outside the range of extinction law {law.Name} " +
                $"({law.MinWavelengthAngstrom:0.#}-{law.MaxWavelengthAngstrom:0.#} Angstrom)", file);
    }

    internal static string Prefix(string? where) => where is null ? "" : where + ": ";
}
