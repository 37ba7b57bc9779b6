using System.Globalization;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// Turns the raw array of a decoded field into a typed <see cref="Column"/> (FITS Standard 4.0, sect. 7.3.2 and 7.3.3):
/// <list type="bullet">
/// <item>TNULLn (integers only) marks rows whose stored value equals it as missing; IEEE NaN is missing for E and D.</item>
/// <item>The unsigned-integer convention (TSCAL = 1, TZERO = -128 / 2^15 / 2^31 / 2^63; FITS Standard 4.0, sect. 7.3.2) gives the next wider
/// signed type: B -> Int16, I -> Int32, J -> Int64, K -> Int64 when every value fits, otherwise Double with a note.</item>
/// <item>Any other TSCALn/TZEROn gives Double: physical = TZERO + TSCAL x stored (the scaling equation of sect. 7.3.2).</item>
/// <item>L: 'T' true, 'F' false, 0 missing; any other byte is an error.</item>
/// </list>
/// </summary>
internal static class FitsColumnBuilder
{
    public static Column Build(FitsColumnDecoder decoder, string file, List<string> notes)
    {
        var s = decoder.Spec;
        switch (decoder.Raw)
        {
            case double[] d:
                if (!s.IsIdentity) for (int i = 0; i < d.Length; i++) d[i] = s.Zero + s.Scale * d[i];
                return new Column<double>(s.Name, d, null, s.Unit, s.Description);
            case float[] f:
                if (s.IsIdentity) return new Column<float>(s.Name, f, null, s.Unit, s.Description);
                var fd = new double[f.Length];
                for (int i = 0; i < f.Length; i++) fd[i] = s.Zero + s.Scale * f[i];
                return new Column<double>(s.Name, fd, null, s.Unit, s.Description);
            case string?[] a:
                return new Column<string>(s.Name, (string[])(Array)a, null, s.Unit, s.Description);
            case byte[] l when s.Code == 'L':
                return Logical(s, l, file);
            default:
                return Integer(s, decoder.Raw, notes);
        }
    }

    private static Column<bool> Logical(FitsFieldSpec s, byte[] raw, string file)
    {
        var v = new bool[raw.Length];
        bool[]? mask = null;
        for (int i = 0; i < raw.Length; i++)
        {
            switch (raw[i])
            {
                case (byte)'T': v[i] = true; break;
                case (byte)'F': break;
                case 0: (mask ??= new bool[raw.Length])[i] = true; break;
                default:
                    throw new InputException(string.Format(CultureInfo.InvariantCulture, FitsMessages.BadLogical, raw[i], i + 1), file, i + 1, s.Name);
            }
        }
        return new Column<bool>(s.Name, v, mask, s.Unit, s.Description);
    }

    private static Column Integer(FitsFieldSpec s, Array raw, List<string> notes)
    {
        int n = raw.Length;
        bool[]? mask = null;
        if (s.Null is long tnull)
        {
            for (int i = 0; i < n; i++)
                if (RawAt(raw, i) == tnull) (mask ??= new bool[n])[i] = true;
        }

        if (s.IsIdentity)
        {
            return raw switch
            {
                byte[] b => new Column<byte>(s.Name, b, mask, s.Unit, s.Description),
                short[] h => new Column<short>(s.Name, h, mask, s.Unit, s.Description),
                int[] j => new Column<int>(s.Name, j, mask, s.Unit, s.Description),
                long[] k => new Column<long>(s.Name, k, mask, s.Unit, s.Description),
                _ => throw new InvalidOperationException(),
            };
        }

        if (s.IsOffsetInteger)
        {
            switch (raw)
            {
                case byte[] b:
                    {
                        var v = new short[n];
                        for (int i = 0; i < n; i++) v[i] = (short)(b[i] - 128);
                        return new Column<short>(s.Name, v, mask, s.Unit, s.Description);
                    }
                case short[] h:
                    {
                        var v = new int[n];
                        for (int i = 0; i < n; i++) v[i] = h[i] + 32768;
                        return new Column<int>(s.Name, v, mask, s.Unit, s.Description);
                    }
                case int[] j:
                    {
                        var v = new long[n];
                        for (int i = 0; i < n; i++) v[i] = j[i] + 2147483648L;
                        return new Column<long>(s.Name, v, mask, s.Unit, s.Description);
                    }
                case long[] k:
                    {
                        // stored = value - 2^63, so the value fits a signed 64-bit integer exactly when stored < 0.
                        bool fits = true;
                        for (int i = 0; i < n && fits; i++) if (k[i] >= 0 && (mask is null || !mask[i])) fits = false;
                        if (fits)
                        {
                            var v = new long[n];
                            for (int i = 0; i < n; i++) v[i] = k[i] ^ long.MinValue;
                            return new Column<long>(s.Name, v, mask, s.Unit, s.Description);
                        }
                        notes.Add(string.Format(CultureInfo.InvariantCulture, FitsMessages.Unsigned64AsDouble, s.Name));
                        var d = new double[n];
                        for (int i = 0; i < n; i++) d[i] = mask is not null && mask[i] ? double.NaN : (double)(ulong)(k[i] ^ long.MinValue);
                        return new Column<double>(s.Name, d, null, s.Unit, s.Description);
                    }
            }
        }

        var scaled = new double[n];
        for (int i = 0; i < n; i++)
            scaled[i] = mask is not null && mask[i] ? double.NaN : s.Zero + s.Scale * RawAt(raw, i);
        return new Column<double>(s.Name, scaled, null, s.Unit, s.Description);
    }

    private static long RawAt(Array raw, int i) => raw switch
    {
        byte[] b => b[i],
        short[] h => h[i],
        int[] j => j[i],
        long[] k => k[i],
        _ => throw new InvalidOperationException(),
    };
}
