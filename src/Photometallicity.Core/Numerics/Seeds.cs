using System.Text;

namespace Photometallicity.Numerics;

/// <summary>
/// Derives the seed of one stochastic step from the run's master seed and the step's name, so that each
/// step has its own reproducible stream and adding a step does not change the others.
/// Hash: 64-bit FNV-1a of the UTF-8 name (Fowler, Noll &amp; Vo; common practice), mixed with SplitMix64.
/// </summary>
public static class Seeds
{
    public static ulong Derive(ulong masterSeed, string name, long index = 0)
    {
        ulong h = 14695981039346656037UL;
        foreach (byte b in Encoding.UTF8.GetBytes(name))
        {
            h ^= b;
            h *= 1099511628211UL;
        }
        ulong x = masterSeed ^ h ^ ((ulong)index * 0xD1B54A32D192ED03UL);
        return Rng.SplitMix(ref x);
    }

    public static Rng For(ulong masterSeed, string name, long index = 0) => new(Derive(masterSeed, name, index));
}
