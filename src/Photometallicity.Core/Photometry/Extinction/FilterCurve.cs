using System.Globalization;
using Photometallicity.Errors;

namespace Photometallicity.Photometry.Extinction;

/// <summary>
/// A filter transmission curve S(lambda) on its own wavelength grid (Angstrom, strictly increasing), transmission
/// dimensionless and non-negative (any scale). File format (see calibration/README.md): plain text, one point a
/// line, "wavelength,transmission" (comma, or whitespace/semicolon separated); lines starting with '#' and blank
/// lines are ignored; one optional non-numeric header line (e.g. "wavelength_angstrom,transmission").
/// </summary>
public sealed class FilterCurve
{
    public const int MinPoints = 3;

    private readonly double[] _wavelengths, _transmission;

    private FilterCurve(string name, double[] wavelengths, double[] transmission)
    {
        Name = name;
        _wavelengths = wavelengths;
        _transmission = transmission;
    }

    /// <summary>A label: the file name without extension, or the name given to <see cref="FromArrays"/>.</summary>
    public string Name { get; }

    /// <summary>The wavelength grid (Angstrom, strictly increasing).</summary>
    public IReadOnlyList<double> WavelengthAngstrom => _wavelengths;

    /// <summary>The transmission at each grid point (dimensionless, not negative).</summary>
    public IReadOnlyList<double> Transmission => _transmission;

    public int Count => _wavelengths.Length;

    internal double[] Wavelengths => _wavelengths;

    internal double[] Throughput => _transmission;

    /// <summary>Reads a curve file; InputException naming the file and row on any bad content.</summary>
    public static FilterCurve Load(string path)
    {
        if (!File.Exists(path)) throw new InputException("filter curve file not found", path);
        var wl = new List<double>();
        var tr = new List<double>();
        var lineNumbers = new List<long>();
        bool headerSeen = false;
        long lineNo = 0;
        IEnumerable<string> lines;
        try { lines = File.ReadAllLines(path); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException($"cannot read the filter curve: {e.Message}", path, inner: e);
        }
        foreach (string raw in lines)
        {
            lineNo++;
            string line = raw.Trim();
            if (line.Length == 0 || line[0] == '#') continue;
            string[] parts = line.Split([',', ';', ' ', '\t'], StringSplitOptions.RemoveEmptyEntries);
            double w = double.NaN, t = double.NaN;
            bool n0 = parts.Length >= 1 && double.TryParse(parts[0], NumberStyles.Float, CultureInfo.InvariantCulture, out w);
            bool n1 = parts.Length >= 2 && double.TryParse(parts[1], NumberStyles.Float, CultureInfo.InvariantCulture, out t);
            if (!n0 && wl.Count == 0 && !headerSeen) { headerSeen = true; continue; }
            if (parts.Length != 2)
                throw new InputException($"expected 2 values (wavelength in Angstrom, transmission), found {parts.Length} (line {lineNo} of the file)", path, wl.Count + 1);
            if (!n0 || !n1)
                throw new InputException($"'{line}' is not a pair of numbers (wavelength in Angstrom, transmission) (line {lineNo} of the file)", path, wl.Count + 1);
            wl.Add(w);
            tr.Add(t);
            lineNumbers.Add(lineNo);
        }
        return Validate(Path.GetFileNameWithoutExtension(path), wl.ToArray(), tr.ToArray(), path, lineNumbers);
    }

    /// <summary>A curve from arrays (copied); same checks as <see cref="Load"/>, rows numbered from 1.</summary>
    public static FilterCurve FromArrays(string name, double[] wavelengthAngstrom, double[] transmission)
    {
        if (wavelengthAngstrom.Length != transmission.Length)
            throw new InputException($"filter curve '{name}': {wavelengthAngstrom.Length} wavelengths but {transmission.Length} transmissions");
        return Validate(name, (double[])wavelengthAngstrom.Clone(), (double[])transmission.Clone(), null, null);
    }

    private static FilterCurve Validate(string name, double[] wl, double[] tr, string? file, List<long>? rows)
    {
        string label = file ?? $"filter curve '{name}'";
        long Row(int i) => i + 1; // data rows, 1-based, comment and header lines excluded (InputException convention)
        string Line(int i) => rows is null ? "" : $" (line {rows[i]} of the file)";
        if (wl.Length < MinPoints)
            throw new InputException($"a filter curve needs at least {MinPoints} points, found {wl.Length}", label);
        for (int i = 0; i < wl.Length; i++)
        {
            if (!double.IsFinite(wl[i]) || wl[i] <= 0)
                throw new InputException($"wavelength {wl[i]} is not a positive finite number of Angstrom{Line(i)}", label, Row(i), "wavelength");
            if (!double.IsFinite(tr[i]) || tr[i] < 0)
                throw new InputException($"transmission {tr[i]} is negative or not finite{Line(i)}", label, Row(i), "transmission");
            if (i > 0 && !(wl[i] > wl[i - 1]))
                throw new InputException($"wavelengths must increase strictly: {wl[i]} follows {wl[i - 1]}{Line(i)}", label, Row(i), "wavelength");
        }
        if (tr.All(t => t == 0))
            throw new InputException("the transmission is zero everywhere", label);
        return new FilterCurve(name, wl, tr);
    }
}
