using System.Globalization;
using System.Text.Json;
using Photometallicity.Errors;

namespace Photometallicity.Configuration;

/// <summary>
/// A JSON value with its path in the config file ("bands.blue.mag"), so that every error names the key.
/// Objects track which keys were read; <see cref="RejectUnknown"/> turns any other key into an error.
/// </summary>
internal sealed class ConfigNode
{
    private readonly HashSet<string> _known = new(StringComparer.Ordinal);

    public ConfigNode(JsonElement element, string path, string file)
    {
        Element = element;
        Path = path;
        File = file;
    }

    public JsonElement Element { get; }
    public string Path { get; }
    public string File { get; }

    private string Child(string key) => Path.Length == 0 ? key : $"{Path}.{key}";

    public InputException Error(string message) => new($"config key '{Path}': {message}", File);

    public ConfigNode RequireObject()
    {
        if (Element.ValueKind != JsonValueKind.Object) throw Error($"expected an object, found {Describe(Element)}");
        return this;
    }

    public ConfigNode? Optional(string key)
    {
        RequireObject();
        _known.Add(key);
        if (!Element.TryGetProperty(key, out var v) || v.ValueKind == JsonValueKind.Null) return null;
        return new ConfigNode(v, Child(key), File);
    }

    public ConfigNode Required(string key) =>
        Optional(key) ?? throw new InputException($"config key '{Child(key)}' is required but missing", File);

    public string AsString()
    {
        if (Element.ValueKind != JsonValueKind.String) throw Error($"expected a string, found {Describe(Element)}");
        string s = Element.GetString()!;
        if (s.Length == 0) throw Error("must not be empty");
        return s;
    }

    public double AsNumber()
    {
        if (Element.ValueKind != JsonValueKind.Number) throw Error($"expected a number, found {Describe(Element)}");
        double d = Element.GetDouble();
        if (!double.IsFinite(d)) throw Error("must be finite");
        return d;
    }

    public double AsNumber(double min, double max)
    {
        double d = AsNumber();
        if (d < min || d > max) throw Error($"value {d.ToString(CultureInfo.InvariantCulture)} is outside the allowed range [{min.ToString(CultureInfo.InvariantCulture)}, {max.ToString(CultureInfo.InvariantCulture)}]");
        return d;
    }

    public int AsInt(int min, int max)
    {
        if (Element.ValueKind != JsonValueKind.Number || !Element.TryGetInt64(out long v))
            throw Error($"expected an integer, found {Describe(Element)}");
        if (v < min || v > max) throw Error($"value {v} is outside the allowed range [{min}, {max}]");
        return (int)v;
    }

    public ulong AsSeed()
    {
        if (Element.ValueKind != JsonValueKind.Number || !Element.TryGetUInt64(out ulong v))
            throw Error($"expected a non-negative integer seed, found {Describe(Element)}");
        return v;
    }

    public bool AsBool()
    {
        if (Element.ValueKind is not (JsonValueKind.True or JsonValueKind.False))
            throw Error($"expected true or false, found {Describe(Element)}");
        return Element.GetBoolean();
    }

    public IEnumerable<ConfigNode> Items()
    {
        if (Element.ValueKind != JsonValueKind.Array) throw Error($"expected an array, found {Describe(Element)}");
        int i = 0;
        foreach (var e in Element.EnumerateArray()) yield return new ConfigNode(e, $"{Path}[{i++}]", File);
    }

    public bool IsKind(JsonValueKind kind) => Element.ValueKind == kind;

    /// <summary>Every key of this object that no reader asked for is an error naming it and the known keys.</summary>
    public void RejectUnknown()
    {
        foreach (var p in Element.EnumerateObject())
            if (!_known.Contains(p.Name))
                throw new InputException(
                    $"unknown config key '{Child(p.Name)}'; the keys allowed here are: {string.Join(", ", _known.Order(StringComparer.Ordinal))}", File);
    }

    private static string Describe(JsonElement e) => e.ValueKind switch
    {
        JsonValueKind.String => $"the string \"{e.GetString()}\"",
        JsonValueKind.Number => $"the number {e.GetRawText()}",
        JsonValueKind.True or JsonValueKind.False => $"the boolean {e.GetRawText()}",
        JsonValueKind.Array => "an array",
        JsonValueKind.Object => "an object",
        _ => "null",
    };
}
