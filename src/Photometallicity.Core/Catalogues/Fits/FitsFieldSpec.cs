namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// One column as the reader will decode it: where its bytes sit in a row, its TFORM code and width, and the
/// TSCALn/TZEROn/TNULLn/TUNITn values of its field (FITS Standard 4.0, sect. 7.3.2). A numeric vector field
/// (repeat &gt; 1) becomes one spec per element, named name_0, name_1, ...
/// </summary>
internal sealed record FitsFieldSpec(
    int FieldNumber,
    string Name,
    char Code,
    int Offset,
    int Width,
    string? Unit,
    string? Description,
    double Scale,
    double Zero,
    decimal? ZeroExact,
    long? Null)
{
    /// <summary>TSCAL = 1 and TZERO = 0 (or absent): values are stored as they are.</summary>
    public bool IsIdentity => Scale == 1.0 && Zero == 0.0;

    /// <summary>
    /// The unsigned-integer convention of sect. 7.3.2 (its table "Usage of TZEROn to represent non-default integer data types"): TSCAL = 1 with TZERO = -128 for B (signed byte),
    /// 2^15 for I, 2^31 for J or 2^63 for K.
    /// </summary>
    public bool IsOffsetInteger => Scale == 1.0 && ZeroExact is decimal z && (Code, z) switch
    {
        ('B', -128m) => true,
        ('I', 32768m) => true,
        ('J', 2147483648m) => true,
        ('K', 9223372036854775808m) => true,
        _ => false,
    };
}
