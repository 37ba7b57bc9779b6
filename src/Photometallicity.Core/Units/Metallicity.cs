namespace Photometallicity.Units;

/// <summary>An iron abundance [Fe/H] in dex relative to the Sun.</summary>
public readonly record struct Metallicity(double Dex)
{
    public static Metallicity FromDex(double dex) => new(dex);
    public override string ToString() => $"[Fe/H] = {Dex:+0.00;-0.00} dex";
}
