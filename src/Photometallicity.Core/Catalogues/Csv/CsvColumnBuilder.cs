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
    private readonly Utf8Column.Builder? _compact; // forced text kept as UTF-8 bytes
    private readonly SentinelSet _sentinels;
    private Kind _kind;
    private BlockList<long>? _longs;
    private BlockList<double>? _doubles;
    private BlockList<bool>? _bools;
    private BlockList<string?>? _strings;
    private BlockList<bool>? _missing;
    private int _count;
    private bool _valueSeen;   // a cell that is not a missing marker has been seen (sentinels included)
    private bool _valueBefore; // ... before the current cell

    public CsvColumnBuilder(string name, int index, bool forceText, bool forceNumeric, SentinelSet sentinels, bool compactText = false)
    {
        Name = name;
        Index = index;
        _forceNumeric = forceNumeric;
        _sentinels = sentinels;
        if (forceText) _kind = Kind.Text;
        if (forceText && compactText) _compact = new Utf8Column.Builder(name, 1 << 16);
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
        if (_compact is not null)
        {
            if (CsvCells.IsMissingToken(cell) && !CsvCells.IsQuotedEmpty(reader.GetRawSpan(Index))) _compact.AddMissing();
            else _compact.Add(cell);
            _count++;
            return;
        }
        if (_kind == Kind.Text)
        {
            _strings ??= new();
            _strings[i] = CsvCells.IsMissingToken(cell) && !CsvCells.IsQuotedEmpty(reader.GetRawSpan(Index)) ? null : CsvCells.ToText(cell);
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
                    (_longs ??= new())[i] = l;
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
                    (_bools ??= new())[i] = b0;
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
                    (_bools ??= new())[i] = b;
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
        if (_compact is not null) return _compact.ToColumn();
        bool[]? mask = _missing?.ToArray(n);
        _missing = null;
        switch (_kind)
        {
            case Kind.Integer:
                return new Column<long>(Name, Take(ref _longs, n), mask);
            case Kind.Real:
                var d = Take(ref _doubles, n);
                if (mask is not null)
                    for (int r = 0; r < n; r++) if (mask[r]) d[r] = double.NaN;
                return new Column<double>(Name, d);
            case Kind.Boolean:
                return new Column<bool>(Name, Take(ref _bools, n), mask);
            case Kind.Text:
                return new Column<string>(Name, Take(ref _strings, n)!);
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
        (_doubles ??= new())[i] = d;
        _count++;
    }

    private void AddMissing()
    {
        (_missing ??= new())[_count] = true;
        _count++;
    }

    private void ToReal()
    {
        if (_kind == Kind.Integer && _longs is not null)
        {
            _doubles = new BlockList<double>();
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
        _strings = new BlockList<string?>();
        if (_valueBefore) BackfillRows = _count;
        _longs = null;
        _doubles = null;
        _bools = null;
        _kind = Kind.Text;
        _strings[_count++] = CsvCells.ToText(cell);
    }

    /// <summary>The builder's values as an exact-length array (zeros when none were stored); the blocks are released.</summary>
    private static T[] Take<T>(ref BlockList<T>? list, int n)
    {
        var a = list?.ToArray(n) ?? new T[n];
        list = null;
        return a;
    }
}
