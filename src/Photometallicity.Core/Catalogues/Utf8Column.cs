using System.Globalization;
using System.Text;

namespace Photometallicity.Catalogues;

/// <summary>
/// A text column kept as UTF-8 bytes: every row's bytes one after the other in one array, an end offset per row, and an
/// optional missing mask (a missing row has no bytes; an empty string is not missing). It costs the text's bytes plus 4
/// bytes a row, against ~20 bytes of object header and length plus 2 bytes a character plus an 8-byte reference a row for
/// a <see cref="Column{T}"/> of strings (an id such as VD0000001: 13 bytes instead of 48). <see cref="GetString"/> makes a
/// new string on each call, so a hot loop should use <see cref="Utf8"/>. The bytes are always valid UTF-8 (the builders
/// replace invalid sequences as decoding to a string would), so they read back as the same string.
/// </summary>
public sealed class Utf8Column : Column
{
    private readonly byte[] _bytes;
    private readonly int[] _ends;
    private readonly bool[]? _missing;

    public Utf8Column(string name, byte[] bytes, int[] ends, bool[]? missing = null, string? unit = null, string? description = null)
        : base(name, unit, description)
    {
        if (missing is not null && missing.Length != ends.Length)
            throw new ArgumentException($"Column '{name}': mask has {missing.Length} entries, rows {ends.Length}.");
        if (ends.Length > 0 && ends[^1] > bytes.Length)
            throw new ArgumentException($"Column '{name}': the rows end at byte {ends[^1]} of {bytes.Length}.");
        _bytes = bytes;
        _ends = ends;
        _missing = missing;
    }

    public override ColumnType Type => ColumnType.String;
    public override int Length => _ends.Length;

    /// <summary>The row's UTF-8 bytes (empty where missing).</summary>
    public ReadOnlySpan<byte> Utf8(int row)
    {
        int start = row == 0 ? 0 : _ends[row - 1];
        return _bytes.AsSpan(start, _ends[row] - start);
    }

    public override bool IsMissing(int row) => _missing is not null && _missing[row];

    public override double GetDouble(int row) =>
        !IsMissing(row) && double.TryParse(Utf8(row), NumberStyles.Float, CultureInfo.InvariantCulture, out var x) ? x : double.NaN;

    public override string? GetString(int row) => IsMissing(row) ? null : Encoding.UTF8.GetString(Utf8(row));

    public override Column Select(ReadOnlySpan<int> rows)
    {
        var b = new Builder(Name, rows.Length);
        foreach (int r in rows)
        {
            if (IsMissing(r)) b.AddMissing();
            else b.Add(Utf8(r));
        }
        return b.ToColumn(Unit, Description);
    }

    public override Column Rename(string newName) => new Utf8Column(newName, _bytes, _ends, _missing, Unit, Description);

    /// <summary>
    /// The text of <paramref name="source"/> (any column type, as <see cref="Column.GetString"/> gives it) at the given
    /// rows; a negative row gives a missing value.
    /// </summary>
    public static Utf8Column Gather(string name, Column source, ReadOnlySpan<int> rows)
    {
        var b = new Builder(name, rows.Length);
        var u = source as Utf8Column;
        foreach (int r in rows)
        {
            if (r < 0 || source.IsMissing(r)) b.AddMissing();
            else if (u is not null) b.Add(u.Utf8(r));
            else b.Add(source.GetString(r)!);
        }
        return b.ToColumn();
    }

    /// <summary>Appends rows in order; growing copies only the byte array and the end offsets.</summary>
    public sealed class Builder
    {
        private readonly string _name;
        private byte[] _bytes;
        private int[] _ends;
        private bool[]? _missing;
        private int _count, _used;

        public Builder(string name, int capacity = 16)
        {
            _name = name;
            _ends = new int[Math.Max(capacity, 1)];
            _bytes = new byte[Math.Max(capacity * 8, 16)];
        }

        public int Count => _count;

        /// <summary>Appends a row's bytes; invalid UTF-8 is replaced as <see cref="Encoding.UTF8"/> would decode it.</summary>
        public void Add(ReadOnlySpan<byte> utf8)
        {
            if (!System.Text.Unicode.Utf8.IsValid(utf8))
            {
                Add(Encoding.UTF8.GetString(utf8));
                return;
            }
            Reserve(utf8.Length);
            utf8.CopyTo(_bytes.AsSpan(_used));
            _used += utf8.Length;
            End();
        }

        public void Add(string text)
        {
            int n = Encoding.UTF8.GetByteCount(text);
            Reserve(n);
            _used += Encoding.UTF8.GetBytes(text, _bytes.AsSpan(_used));
            End();
        }

        public void AddMissing()
        {
            if (_missing is null || _missing.Length < _ends.Length) Array.Resize(ref _missing, _ends.Length);
            _missing[_count] = true;
            Reserve(0);
            End();
        }

        public Utf8Column ToColumn(string? unit = null, string? description = null)
        {
            var ends = _ends.Length == _count ? _ends : _ends[.._count];
            var bytes = _bytes.Length == _used ? _bytes : _bytes[.._used];
            bool[]? missing = _missing is null ? null : _missing.Length == _count ? _missing : _missing[.._count];
            _ends = []; _bytes = []; _missing = null;
            return new Utf8Column(_name, bytes, ends, missing, unit, description);
        }

        private void Reserve(int bytes)
        {
            if (_count == _ends.Length)
            {
                Array.Resize(ref _ends, checked(_ends.Length * 2));
                if (_missing is not null) Array.Resize(ref _missing, _ends.Length);
            }
            long need = (long)_used + bytes;
            if (need > Array.MaxLength)
                throw new Errors.InputException($"column '{_name}' holds more than {Array.MaxLength} bytes of text, more than one column can hold");
            if (need > _bytes.Length) Array.Resize(ref _bytes, (int)Math.Min(Array.MaxLength, Math.Max(need, 2L * _bytes.Length)));
        }

        private void End() => _ends[_count++] = _used;
    }
}
