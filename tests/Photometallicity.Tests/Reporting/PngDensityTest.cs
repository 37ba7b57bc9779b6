using System.Text;
using Photometallicity.Reporting;

namespace Photometallicity.Tests.Reporting;

public class PngDensityTest
{
    [Fact]
    public void Crc_StandardCheckValue()
    {
        // CRC-32 check value of "123456789" is 0xCBF43926 (Williams 1993, "A painless guide to CRC error
        // detection algorithms", CRC-32 parameter set; also in the PNG specification's sample code).
        Assert.Equal(0xCBF43926u, PngDensity.Crc(Encoding.ASCII.GetBytes("1234"), Encoding.ASCII.GetBytes("56789")));
    }

    [Fact]
    public void Crc_OfIend_IsTheConstantEveryPngEndsWith()
    {
        // Every PNG ends with the empty IEND chunk, whose CRC is AE 42 60 82 (PNG specification, 11.2.5).
        Assert.Equal(0xAE426082u, PngDensity.Crc(Encoding.ASCII.GetBytes("IEND"), []));
    }

    [Fact]
    public void WithDpi_WritesOnePhysChunkAfterIhdr()
    {
        var plot = FigureRenderer.Single(ForecastPlot.Build(InventedField.Forecast()));
        byte[] png = FigureRenderer.Png(plot, FigureOptions.Default with { Dpi = 300, WidthPx = 600, HeightPx = 450 });
        var info = FigureChecks.Png(png);
        Assert.Equal("pHYs", info.Chunks[1]);
        Assert.Single(info.Chunks, "pHYs");
        Assert.Equal(11811u, info.PixelsPerMetre); // 300 / 0.0254
        Assert.Equal(600, info.Width);
        Assert.Equal(450, info.Height);
        byte[] again = PngDensity.WithDpi(png, 150); // replaces, never duplicates
        var info2 = FigureChecks.Png(again);
        Assert.Single(info2.Chunks, "pHYs");
        Assert.Equal(5906u, info2.PixelsPerMetre);
    }
}
