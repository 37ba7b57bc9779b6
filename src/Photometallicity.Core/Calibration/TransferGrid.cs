namespace Photometallicity.Calibration;

/// <summary>
/// A dense (C_new, [Fe/H]) grid over the bounding box of the transformed domain with its normal matrix factored
/// once, so that mapping many coefficient vectors through a filter transformation costs one back-substitution
/// each. The grid covers the box (not only the hull): the mapped function is of the basis's own form there (a polynomial, or
/// a monotone model whose colour range maps linearly), and the box keeps the least-squares problem well conditioned.
/// </summary>
internal sealed class TransferGrid
{
    private const int ColourSteps = 41, FehSteps = 31;
    private readonly IIndexBasis _basis;
    private readonly double[] _c, _f, _terms, _chol;

    public TransferGrid(IIndexBasis newBasis, ValidityDomain domain)
    {
        _basis = newBasis;
        int p = newBasis.Count, g = ColourSteps * FehSteps;
        double c0 = domain.ColourMin, c1 = domain.ColourMax, f0 = domain.FehMin, f1 = domain.FehMax;
        if (c1 - c0 < 1e-6) { c0 -= 0.25; c1 += 0.25; }
        if (f1 - f0 < 1e-6) { f0 -= 0.5; f1 += 0.5; }
        _c = new double[g]; _f = new double[g]; _terms = new double[g * p]; _chol = new double[p * p];
        int k = 0;
        for (int a = 0; a < ColourSteps; a++)
            for (int b = 0; b < FehSteps; b++, k++)
            {
                _c[k] = c0 + (c1 - c0) * a / (ColourSteps - 1);
                _f[k] = f0 + (f1 - f0) * b / (FehSteps - 1);
                newBasis.Terms(_c[k], _f[k], _terms.AsSpan(k * p, p));
            }
        for (int i = 0; i < g; i++)
            for (int r = 0; r < p; r++)
                for (int c = 0; c <= r; c++) _chol[r * p + c] += _terms[i * p + r] * _terms[i * p + c];
        if (!SmallCholesky.Factor(_chol, p)) throw new InvalidOperationException("transfer grid normal matrix is singular");
    }

    /// <summary>Least-squares coefficients on the new basis of (f_old(a0 + a1 C, F) - b0 - b2 C) / b1.</summary>
    public double[] Refit(IIndexBasis oldBasis, ReadOnlySpan<double> oldCoef, FilterTransform t)
    {
        int p = _basis.Count;
        var rhs = new double[p];
        for (int i = 0; i < _c.Length; i++)
        {
            double y = (oldBasis.Value(oldCoef, t.OldColour(_c[i]), _f[i]) - t.B0 - t.B2 * _c[i]) / t.B1;
            for (int r = 0; r < p; r++) rhs[r] += _terms[i * p + r] * y;
        }
        SmallCholesky.Solve(_chol, p, rhs);
        return rhs;
    }
}
