namespace Photometallicity.Reporting;

/// <summary>The two files of one written figure.</summary>
public sealed record FigureFiles(string PngPath, string SvgPath);
