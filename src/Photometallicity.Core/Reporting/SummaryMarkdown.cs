using System.Globalization;
using System.Text;

namespace Photometallicity.Reporting;

/// <summary>
/// The Markdown form of the summary page (same sections as the HTML). Text is escaped so that it reads as
/// written: Markdown punctuation is backslash-escaped and &lt;, &gt;, &amp; are written as entities, so no
/// input can inject HTML into a rendered page. Figures are linked by paths relative to the Markdown file.
/// </summary>
internal static class SummaryMarkdown
{
    public static string Build(SummaryPageData d, string markdownDirectory)
    {
        var m = new StringBuilder();
        m.Append("# ").Append(T(d.Title)).Append("\n\n");
        if (d.Subtitle is not null) m.Append('*').Append(T(d.Subtitle)).Append("*\n\n");

        m.Append("## Warnings\n\n");
        if (d.Warnings.Count == 0) m.Append("No warnings.\n\n");
        else
        {
            foreach (var w in d.Warnings) m.Append("- **Warning:** ").Append(T(w)).Append('\n');
            m.Append('\n');
        }

        m.Append("## Key numbers\n\n| quantity | value | uncertainty (1σ) | unit |\n| --- | ---: | ---: | --- |\n");
        foreach (var k in d.KeyNumbers)
        {
            var (v, u) = ValueFormat.Format(k);
            m.Append("| ").Append(T(k.Label)).Append(" | ").Append(T(v)).Append(" | ").Append(u.Length > 0 ? "± " + T(u) : "")
             .Append(" | ").Append(T(k.Unit)).Append(" |\n");
        }
        m.Append('\n');

        m.Append("## Figures\n\n");
        for (int i = 0; i < d.Figures.Count; i++)
        {
            var f = d.Figures[i];
            m.Append("![").Append(T(f.Title ?? f.Caption)).Append("](").Append(RelativeLink(markdownDirectory, f.PngPath)).Append(")\n\n")
             .Append("**Figure ").Append((i + 1).ToString(CultureInfo.InvariantCulture)).Append('.')
             .Append(f.Title is null ? "" : " " + T(f.Title) + ".").Append("** ").Append(T(f.Caption)).Append("\n\n");
        }

        m.Append("## Inputs\n\n| file | role | rows | SHA-256 |\n| --- | --- | ---: | --- |\n");
        foreach (var f in d.Inputs)
            m.Append("| ").Append(T(f.Path)).Append(" | ").Append(T(f.Role ?? "")).Append(" | ").Append(T(ValueFormat.Rows(f.Rows)))
             .Append(" | ").Append(T(f.Sha256)).Append(" |\n");
        m.Append('\n');

        m.Append("## Outputs\n\n");
        foreach (var o in d.Outputs) m.Append("- ").Append(T(o.Path)).Append(o.Description is null ? "" : " — " + T(o.Description)).Append('\n');
        m.Append('\n');

        var p = d.Provenance;
        m.Append("## Provenance\n\n| setting | value |\n| --- | --- |\n");
        m.Append("| software version | ").Append(T(p.SoftwareVersion)).Append(" |\n");
        if (p.MasterSeed is long seed) m.Append("| master seed | ").Append(seed.ToString(CultureInfo.InvariantCulture)).Append(" |\n");
        if (p.GeneratedAt is not null) m.Append("| generated | ").Append(T(p.GeneratedAt)).Append(" |\n");
        foreach (var kv in p.Settings) m.Append("| ").Append(T(kv.Key)).Append(" | ").Append(T(kv.Value)).Append(" |\n");
        if (p.ConfigText is not null)
        {
            // An indented code block cannot be closed early by any content, unlike a fenced one.
            m.Append("\n### Resolved configuration\n\n");
            foreach (var line in p.ConfigText.Replace("\r\n", "\n").Split('\n')) m.Append("    ").Append(line).Append('\n');
        }
        return m.ToString();
    }

    /// <summary>
    /// Escapes text for Markdown inline and table-cell positions (never the start of a line here): the
    /// emphasis, code, link, table and strike-through characters with a backslash, &lt; &gt; &amp; as entities.
    /// </summary>
    internal static string T(string s)
    {
        var b = new StringBuilder(s.Length + 8);
        foreach (char c in s)
        {
            switch (c)
            {
                case '&': b.Append("&amp;"); break;
                case '<': b.Append("&lt;"); break;
                case '>': b.Append("&gt;"); break;
                case '\r': break;
                case '\n': b.Append(' '); break;
                case '\\' or '`' or '*' or '_' or '[' or ']' or '|' or '~':
                    b.Append('\\').Append(c); break;
                default: b.Append(c); break;
            }
        }
        return b.ToString();
    }

    private static string RelativeLink(string fromDirectory, string file)
    {
        string rel = Path.GetRelativePath(fromDirectory, Path.GetFullPath(file)).Replace('\\', '/');
        return string.Join('/', rel.Split('/').Select(seg => seg == ".." ? seg : Uri.EscapeDataString(seg)));
    }
}
