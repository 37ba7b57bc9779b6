namespace Photometallicity.Catalogues.Fits;

/// <summary>Reads a Fits table file into a <see cref="Table"/>. (Placeholder until the Fits reader lands.)</summary>
public static class FitsTableReader
{
    public static Table Read(string path, ReadOptions options) =>
        throw new NotImplementedException("Fits reading is not implemented yet");
}
