namespace Photometallicity.Numerics;

/// <summary>
/// A small, fast, seedable generator with a fixed algorithm, so that the same seed gives the same
/// stream on every platform and .NET version: xoshiro256** (Blackman &amp; Vigna 2018,
/// "Scrambled linear pseudorandom number generators", ACM TOMS 47, 36), seeded through SplitMix64
/// (Steele, Lea &amp; Flood 2014) as its authors recommend. Not thread-safe: give each task its own.
/// </summary>
public sealed class Rng
{
    private ulong _s0, _s1, _s2, _s3;
    private double _spare;
    private bool _hasSpare;

    public Rng(ulong seed)
    {
        ulong x = seed;
        _s0 = SplitMix(ref x);
        _s1 = SplitMix(ref x);
        _s2 = SplitMix(ref x);
        _s3 = SplitMix(ref x);
    }

    public ulong NextUInt64()
    {
        ulong result = RotL(_s1 * 5, 7) * 9;
        ulong t = _s1 << 17;
        _s2 ^= _s0;
        _s3 ^= _s1;
        _s1 ^= _s2;
        _s0 ^= _s3;
        _s2 ^= t;
        _s3 = RotL(_s3, 45);
        return result;
    }

    /// <summary>Uniform in [0, 1) with 53 random bits.</summary>
    public double NextDouble() => (NextUInt64() >> 11) * (1.0 / 9007199254740992.0);

    /// <summary>Uniform integer in [0, n), without modulo bias (Lemire 2019, ACM TOMACS 29, 3).</summary>
    public int NextInt(int n)
    {
        if (n <= 0) throw new ArgumentOutOfRangeException(nameof(n));
        ulong un = (ulong)n;
        while (true)
        {
            ulong x = NextUInt64();
            UInt128 m = (UInt128)x * un;
            ulong low = (ulong)m;
            if (low >= un || low >= (0UL - un) % un) return (int)(m >> 64);
        }
    }

    /// <summary>Standard normal deviate by the Marsaglia polar method (Marsaglia &amp; Bray 1964, SIAM Rev. 6, 260).</summary>
    public double NextGaussian()
    {
        if (_hasSpare)
        {
            _hasSpare = false;
            return _spare;
        }
        double u, v, s;
        do
        {
            u = 2.0 * NextDouble() - 1.0;
            v = 2.0 * NextDouble() - 1.0;
            s = u * u + v * v;
        } while (s >= 1.0 || s == 0.0);
        double f = Math.Sqrt(-2.0 * Math.Log(s) / s);
        _spare = v * f;
        _hasSpare = true;
        return u * f;
    }

    public double NextGaussian(double mean, double sigma) => mean + sigma * NextGaussian();

    private static ulong RotL(ulong x, int k) => (x << k) | (x >> (64 - k));

    internal static ulong SplitMix(ref ulong x)
    {
        ulong z = x += 0x9E3779B97F4A7C15UL;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }
}
