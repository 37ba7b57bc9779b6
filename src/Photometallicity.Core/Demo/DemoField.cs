using Photometallicity.Catalogues;

namespace Photometallicity.Demo;

/// <summary>The generated invented field: the three input tables, the per-star truth table and the truth parameters.</summary>
public sealed record DemoField(Table Broadband, Table Narrowband, Table Standards, Table StarTruth, DemoTruth Truth);
