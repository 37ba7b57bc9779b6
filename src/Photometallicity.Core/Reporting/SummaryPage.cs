using System.Net;
using System.Text;
using Photometallicity.Catalogues;
using Photometallicity.Errors;

namespace Photometallicity.Reporting;

/// <summary>
/// The human-readable summary of a run: one self-contained HTML file (figures embedded as base64 PNG data
/// URIs, inline CSS, no external resources, every text HTML-encoded) or a Markdown file that links the PNG
/// files beside it. Sections: warnings (highlighted), key numbers with uncertainties, figures with captions,
/// inputs (rows, SHA-256), outputs, provenance. The output is a pure function of the data: no time stamp
/// unless one is passed in <see cref="ProvenanceInfo.GeneratedAt"/>. Both are written atomically.
/// </summary>
public static class SummaryPage
{
    private const string Css = """
        body{font-family:"DejaVu Sans",Verdana,Arial,sans-serif;color:#1a1a1a;max-width:1100px;margin:2em auto;padding:0 1.5em;line-height:1.45}
        h1{font-size:1.7em;margin-bottom:.1em}h2{font-size:1.25em;border-bottom:1px solid #ccc;padding-bottom:.2em;margin-top:1.8em}
        .subtitle{color:#555;margin-top:0}
        table{border-collapse:collapse;margin:.5em 0}th,td{border:1px solid #d0d0d0;padding:.3em .7em;text-align:left;vertical-align:top}
        th{background:#f2f2f2}td.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
        code,pre{font-family:"DejaVu Sans Mono",Menlo,Consolas,monospace;font-size:.9em}
        pre{background:#f6f6f6;border:1px solid #ddd;padding:.8em;overflow-x:auto;white-space:pre-wrap}
        .warnings{background:#fff4e0;border-left:6px solid #e69f00;padding:.6em 1.2em}.warnings li{margin:.25em 0}
        .ok{color:#006b4e}
        figure{margin:1.5em 0;text-align:center}figure img{max-width:100%;height:auto;border:1px solid #e0e0e0}
        figcaption{text-align:left;font-size:.95em;color:#333;margin-top:.4em}
        """;

    public static void WriteHtml(SummaryPageData data, string path)
    {
        Validate(data);
        AtomicFile.WriteAllText(path, Html(data));
    }

    public static void WriteMarkdown(SummaryPageData data, string path)
    {
        Validate(data);
        string dir = Path.GetDirectoryName(Path.GetFullPath(path))!;
        AtomicFile.WriteAllText(path, SummaryMarkdown.Build(data, dir));
    }

    internal static void Validate(SummaryPageData d)
    {
        ArgumentNullException.ThrowIfNull(d);
        ArgumentNullException.ThrowIfNull(d.Provenance);
        foreach (var f in d.Figures)
            if (!File.Exists(f.PngPath)) throw new InputException("figure file not found", file: f.PngPath);
    }

    internal static string Html(SummaryPageData d)
    {
        var h = new StringBuilder();
        h.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
         .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
         .Append("<title>").Append(E(d.Title)).Append("</title>\n<style>\n").Append(Css).Append("</style>\n</head>\n<body>\n");
        h.Append("<h1>").Append(E(d.Title)).Append("</h1>\n");
        if (d.Subtitle is not null) h.Append("<p class=\"subtitle\">").Append(E(d.Subtitle)).Append("</p>\n");

        h.Append("<h2>Warnings</h2>\n");
        if (d.Warnings.Count == 0) h.Append("<p class=\"ok\">No warnings.</p>\n");
        else
        {
            h.Append("<div class=\"warnings\"><ul>\n");
            foreach (var w in d.Warnings) h.Append("<li>").Append(E(w)).Append("</li>\n");
            h.Append("</ul></div>\n");
        }

        h.Append("<h2>Key numbers</h2>\n<table>\n<tr><th>quantity</th><th>value</th><th>uncertainty (1σ)</th><th>unit</th></tr>\n");
        foreach (var k in d.KeyNumbers)
        {
            var (v, u) = ValueFormat.Format(k);
            h.Append("<tr><td>").Append(E(k.Label)).Append("</td><td class=\"num\">").Append(E(v))
             .Append("</td><td class=\"num\">").Append(u.Length > 0 ? "± " + E(u) : "").Append("</td><td>").Append(E(k.Unit)).Append("</td></tr>\n");
        }
        h.Append("</table>\n");

        h.Append("<h2>Figures</h2>\n");
        for (int i = 0; i < d.Figures.Count; i++)
        {
            var f = d.Figures[i];
            string b64 = Convert.ToBase64String(File.ReadAllBytes(f.PngPath));
            h.Append("<figure>\n<img src=\"data:image/png;base64,").Append(b64).Append("\" alt=\"").Append(E(f.Title ?? f.Caption)).Append("\">\n")
             .Append("<figcaption><strong>Figure ").Append(i + 1).Append('.').Append(f.Title is null ? "" : " " + E(f.Title) + ".")
             .Append("</strong> ").Append(E(f.Caption)).Append("</figcaption>\n</figure>\n");
        }

        h.Append("<h2>Inputs</h2>\n<table>\n<tr><th>file</th><th>role</th><th>rows</th><th>SHA-256</th></tr>\n");
        foreach (var f in d.Inputs)
            h.Append("<tr><td><code>").Append(E(f.Path)).Append("</code></td><td>").Append(E(f.Role ?? "")).Append("</td><td class=\"num\">")
             .Append(E(ValueFormat.Rows(f.Rows))).Append("</td><td><code>").Append(E(f.Sha256)).Append("</code></td></tr>\n");
        h.Append("</table>\n");

        h.Append("<h2>Outputs</h2>\n<ul>\n");
        foreach (var o in d.Outputs)
            h.Append("<li><code>").Append(E(o.Path)).Append("</code>").Append(o.Description is null ? "" : " — " + E(o.Description)).Append("</li>\n");
        h.Append("</ul>\n");

        var p = d.Provenance;
        h.Append("<h2>Provenance</h2>\n<table>\n");
        Row(h, "software version", p.SoftwareVersion);
        if (p.MasterSeed is long seed) Row(h, "master seed", seed.ToString(System.Globalization.CultureInfo.InvariantCulture));
        if (p.GeneratedAt is not null) Row(h, "generated", p.GeneratedAt);
        foreach (var kv in p.Settings) Row(h, kv.Key, kv.Value);
        h.Append("</table>\n");
        if (p.ConfigText is not null) h.Append("<h3>Resolved configuration</h3>\n<pre>").Append(E(p.ConfigText)).Append("</pre>\n");
        h.Append("</body>\n</html>\n");
        return h.ToString();
    }

    private static void Row(StringBuilder h, string key, string value) =>
        h.Append("<tr><th>").Append(E(key)).Append("</th><td>").Append(E(value)).Append("</td></tr>\n");

    private static string E(string s) => WebUtility.HtmlEncode(s);
}
