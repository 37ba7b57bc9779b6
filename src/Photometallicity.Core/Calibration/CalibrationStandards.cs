using Photometallicity.Errors;

namespace Photometallicity.Calibration;

/// <summary>
/// The calibration standards, columnar: dereddened colour C0 and index X0 (mag) with their variances and
/// covariance (mag^2), spectroscopic [Fe/H] and its error (dex), optional log g, and the block each standard
/// belongs to. <see cref="Group"/> = -1 marks an individual star; a value &gt;= 0 is a cluster (or any block of
/// standards sharing one literature [Fe/H]) whose members are resampled together in the bootstrap and kept in
/// one cross-validation fold.
/// </summary>
public sealed class CalibrationStandards
{
    public required string[] Id { get; init; }
    public required double[] Colour0 { get; init; }
    public required double[] Index0 { get; init; }
    public required double[] VarColour { get; init; }
    public required double[] VarIndex { get; init; }
    public required double[] CovIndexColour { get; init; }
    public required double[] Feh { get; init; }
    public required double[] FehErr { get; init; }
    public double[]? LogG { get; init; }
    public required int[] Group { get; init; }

    /// <summary>Name of each group, indexed by group id (Group[i] indexes this array when &gt;= 0).</summary>
    public required string[] GroupName { get; init; }

    /// <summary>The standards at the given rows, in that order (group names kept).</summary>
    public CalibrationStandards Select(IReadOnlyList<int> rows)
    {
        T[] Pick<T>(T[] a) => rows.Select(i => a[i]).ToArray();
        return new CalibrationStandards
        {
            Id = Pick(Id), Colour0 = Pick(Colour0), Index0 = Pick(Index0), VarColour = Pick(VarColour), VarIndex = Pick(VarIndex),
            CovIndexColour = Pick(CovIndexColour), Feh = Pick(Feh), FehErr = Pick(FehErr), LogG = LogG is null ? null : Pick(LogG),
            Group = Pick(Group), GroupName = GroupName,
        };
    }

    public int Count => Id.Length;

    /// <summary>
    /// Checks the arrays' lengths and values. Negative variances or errors and group ids without a name are
    /// input errors; non-finite measurements are not (such standards are reported as unusable).
    /// </summary>
    public void Validate()
    {
        int n = Id.Length;
        void Len(int m, string name)
        {
            if (m != n) throw new InputException($"calibration standards: column '{name}' has {m} values but there are {n} standards.", column: name);
        }
        Len(Colour0.Length, "colour0"); Len(Index0.Length, "index0"); Len(VarColour.Length, "var_colour");
        Len(VarIndex.Length, "var_index"); Len(CovIndexColour.Length, "cov_index_colour"); Len(Feh.Length, "feh");
        Len(FehErr.Length, "feh_err"); Len(Group.Length, "group");
        if (LogG is not null) Len(LogG.Length, "logg");
        for (int i = 0; i < n; i++)
        {
            if (VarColour[i] < 0) throw Bad(i, "var_colour", VarColour[i], "a variance must not be negative");
            if (VarIndex[i] < 0) throw Bad(i, "var_index", VarIndex[i], "a variance must not be negative");
            if (FehErr[i] < 0) throw Bad(i, "feh_err", FehErr[i], "an error must not be negative");
            if (Group[i] < -1 || Group[i] >= GroupName.Length)
                throw Bad(i, "group", Group[i], $"group ids run from -1 (individual star) to {GroupName.Length - 1}");
            double v = VarColour[i] * VarIndex[i];
            if (double.IsFinite(v) && CovIndexColour[i] * CovIndexColour[i] > v * (1 + 1e-9))
                throw Bad(i, "cov_index_colour", CovIndexColour[i], "|covariance| exceeds sqrt(var_colour * var_index)");
        }
    }

    /// <summary>Why standard i cannot be used at all, or null when its values are all finite.</summary>
    public string? Unusable(int i)
    {
        if (!double.IsFinite(Colour0[i])) return "colour0 is missing or not finite";
        if (!double.IsFinite(Index0[i])) return "index0 is missing or not finite";
        if (!double.IsFinite(Feh[i])) return "[Fe/H] is missing or not finite";
        if (!double.IsFinite(VarColour[i]) || !double.IsFinite(VarIndex[i]) || !double.IsFinite(CovIndexColour[i]))
            return "photometric (co)variance is missing or not finite";
        if (!double.IsFinite(FehErr[i])) return "[Fe/H] error is missing or not finite";
        return null;
    }

    private InputException Bad(int i, string column, double value, string what) =>
        new($"calibration standard '{Id[i]}' (standard {i + 1}): {column} = {value}: {what}.", row: i + 1, column: column);
}
