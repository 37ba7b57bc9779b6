namespace Photometallicity.Catalogues;

/// <summary>The element types a catalogue column can hold.</summary>
public enum ColumnType
{
    Double,
    Float,
    Int64,
    Int32,
    Int16,
    Byte,
    Boolean,
    String,
}
