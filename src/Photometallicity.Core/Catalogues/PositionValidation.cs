namespace Photometallicity.Catalogues;

/// <summary>Placeholder until the position checks land.</summary>
public static class PositionValidation
{
    public static void Validate(Table table, string raColumn, string decColumn, string? idColumn) { }
}
