namespace Photometallicity.Catalogues.Fits;

/// <summary>Writes a <see cref="Table"/> as a FITS binary table. (Placeholder until the FITS writer lands.)</summary>
public static class FitsTableWriter
{
    public static void Write(Table table, Stream stream, WriteOptions options) => throw new NotImplementedException("FITS writing is not implemented yet");
}
