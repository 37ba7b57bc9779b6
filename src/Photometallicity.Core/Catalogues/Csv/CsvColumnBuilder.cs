using CsvHelper;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues.Csv;

/// <summary>
/// Collects one CSV column while the file is scanned and decides its type from the content:
/// all integers that fit in a long give Int64, any other numbers Double, true/false Boolean, anything else
/// String. Numbers are parsed straight from the cell bytes into growable columnar arrays, so a numeric column
/// costs no string per cell. A column that turns out to be text after some rows already held numbers or booleans
/// needs their original text (ids such as 007); <see cref="BackfillRows"/> says how many leading rows the reader
/// must read again for it.
/// </summary>
internal sealed class CsvColumnBuilder
{
    private enum Kind { AllMissing, Integer, Real, Boolean, Text }

    private readonly bool _forceNumeric;
    private readonly SentinelSet _sentinels;
    private Kind _kind;
    private long[]? _longs;
    private double[]? _doubles;
    private bool[]? _bools;
    private string?[]? _strings;
    private bool[]? _missing;
    private int _count;
    private bool _valueSeen;   // a cell that is not a missing marker has been seen (sentinels included)
    private bool _valueBefore; // ... before the current cell

    public CsvColumnBuilder(string name, int index, bool forceText, bool forceNumeric, SentinelSet sentinels)
    {
        Name = name;
        Index = index;
        _forceNumeric = forceNumeric;
        _sentinels = sentinels;
        if (forceText) _kind = Kind.Text;
    }

    public string Name { get; }

    /// <summary>0-based field index in the file.</summary>
    public int Index { get; }

    /// <summary>The leading rows whose original text must be read again (0 when none).</summary>
    public int BackfillRows { get; private set; }

    public int Count => _count;

    /// <summary>Adds the next cell, the decoded field <see cref="Index"/> of the reader's current record.</summary>
    public void Add(ReadOnlySpan<byte> cell, CsvReader reader, string path, long row)
    {
        int i = _count;
        if (_kind == Kind.Text)
        {
            EnsureCapacity(ref _strings, i + 1);
            _strings![i] = CsvCells.IsMissingToken(cell) && !CsvCells.IsQuotedEmpty(reader.GetRawSpan(Index)) ? null : CsvCells.ToText(cell);
            _count++;
            return;
        }
        if (CsvCells.IsMissingToken(cell)) { AddMissing(); return; }
        _valueBefore = _valueSeen;
        _valueSeen = true;

        switch (_kind)
        {
            case Kind.AllMissing:
            case Kind.Integer:
                if (CsvCells.TryParseInt64(cell, out long l))
                {
                    if (_kind == Kind.AllMissing) _kind = Kind.Integer;
                    if (_sentinels.Matches(l)) { AddMissing(); return; }
                    EnsureCapacity(ref _longs, i + 1);
                    _longs![i] = l;
                    break;
                }
                if (CsvCells.TryParseDouble(cell, out double d0))
                {
                    ToReal();
                    AddReal(d0);
                    return;
                }
                if (_kind == Kind.AllMissing && !_forceNumeric && CsvCells.TryParseBoolean(cell, out bool b0))
                {
                    _kind = Kind.Boolean;
                    EnsureCapacity(ref _bools, i + 1);
                    _bools![i] = b0;
                    break;
                }
                NotNumeric(cell, path, row);
                return;
            case Kind.Real:
                if (CsvCells.TryParseDouble(cell, out double d))
                {
                    AddReal(d);
                    return;
                }
                NotNumeric(cell, path, row);
                return;
            case Kind.Boolean:
                if (CsvCells.TryParseBoolean(cell, out bool b))
                {
                    EnsureCapacity(ref _bools, i + 1);
                    _bools![i] = b;
                    break;
                }
                ToText(cell);
                return;
        }
        _count++;
    }

    /// <summary>Sets the original text of an early row of a column that became text later.</summary>
    public void SetText(int row, ReadOnlySpan<byte> cell, ReadOnlySpan<byte> raw)
    {
        _strings![row] = CsvCells.IsMissingToken(cell) && !CsvCells.IsQuotedEmpty(raw) ? null : CsvCells.ToText(cell);
    }

    public Column ToColumn()
    {
        int n = _count;
        bool[]? mask = _missing is null ? null : Trim(_missing, n);
        switch (_kind)
        {
            case Kind.Integer:
                return new Column<long>(Name, Trim(_longs ?? [], n), mask);
            case Kind.Real:
                var d = Trim(_doubles ?? [], n);
                if (mask is not null)
                    for (int r = 0; r < n; r++) if (mask[r]) d[r] = double.NaN;
                return new Column<double>(Name, d);
            case Kind.Boolean:
                return new Column<bool>(Name, Trim(_bools ?? [], n), mask);
            case Kind.Text:
                return new Column<string>(Name, Trim(_strings ?? [], n)!);
            default:
                var nan = new double[n];
                Array.Fill(nan, double.NaN);
                return new Column<double>(Name, nan);
        }
    }

    private void AddReal(double d)
    {
        int i = _count;
        if (double.IsNaN(d) || _sentinels.Matches(d)) { AddMissing(); return; }
        EnsureCapacity(ref _doubles, i + 1);
        _doubles![i] = d;
        _count++;
    }

    private void AddMissing()
    {
        EnsureCapacity(ref _missing, _count + 1);
        _missing![_count] = true;
        _count++;
    }

    private void ToReal()
    {
        if (_kind == Kind.Integer && _longs is not null)
        {
            _doubles = new double[_longs.Length];
            for (int r = 0; r < _count; r++) _doubles[r] = _longs[r];
            _longs = null;
        }
        _kind = Kind.Real;
    }

    private void NotNumeric(ReadOnlySpan<byte> cell, string path, long row)
    {
        if (_forceNumeric) throw new InputException(CsvMessages.NotNumeric(CsvCells.ToText(cell)), path, row, Name);
        ToText(cell);
    }

    /// <summary>Switches to text; the earlier rows that held values are read again later.</summary>
    private void ToText(ReadOnlySpan<byte> cell)
    {
        _strings = new string?[Math.Max(16, _count * 2)];
        if (_valueBefore) BackfillRows = _count;
        _longs = null;
        _doubles = null;
        _bools = null;
        _kind = Kind.Text;
        _strings[_count++] = CsvCells.ToText(cell);
    }

    private void EnsureCapacity<T>(ref T[]? array, int needed)
    {
        if (array is null) { array = new T[Math.Max(1024, needed)]; return; }
        if (array.Length >= needed) return;
        Array.Resize(ref array, Math.Max(needed, checked(array.Length * 2)));
    }

    private static T[] Trim<T>(T[] a, int n)
    {
        if (a.Length == n) return a;
        var t = new T[n];
        Array.Copy(a, t, Math.Min(n, a.Length));
        return t;
    }
}
