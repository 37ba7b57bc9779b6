using Photometallicity.Calibration;
using Photometallicity.Numerics;

namespace Photometallicity.Tests.Calibration;

public class FilterTransferTest
{
    // Invented transformation between two invented filter sets.
    private const double A0 = 0.05, A1 = 1.08, B0 = -0.12, B1 = 0.93, B2 = 0.07;

    private static TransferStars Common(int n, ulong seed, double sigma = 0.01)
    {
        var rng = new Rng(seed);
        var s = new TransferStars
        {
            OldColour0 = new double[n], OldIndex0 = new double[n], NewColour0 = new double[n], NewIndex0 = new double[n],
            VarOldColour = new double[n], VarOldIndex = new double[n], VarNewColour = new double[n], VarNewIndex = new double[n],
        };
        for (int i = 0; i < n; i++)
        {
            double cNew = 0.7 + 0.9 * rng.NextDouble(), xNew = 0.2 + 0.8 * rng.NextDouble();
            s.NewColour0[i] = cNew + sigma * rng.NextGaussian();
            s.NewIndex0[i] = xNew + sigma * rng.NextGaussian();
            s.OldColour0[i] = A0 + A1 * cNew + sigma * rng.NextGaussian();
            s.OldIndex0[i] = B0 + B1 * xNew + B2 * cNew + sigma * rng.NextGaussian();
            s.VarOldColour[i] = s.VarOldIndex[i] = s.VarNewColour[i] = s.VarNewIndex[i] = sigma * sigma;
        }
        return s;
    }

    [Fact]
    public void Fit_RecoversKnownTransformationWithinBootstrapErrors()
    {
        var t = FilterTransfer.Fit(Common(150, 41), bootstrap: 200, seed: 3);
        double[] truth = [A0, A1, B0, B1, B2];
        for (int k = 0; k < 5; k++)
        {
            var draws = t.Ensemble.Select(q => q[k]).ToArray();
            double mean = draws.Average(), sd = Math.Sqrt(draws.Sum(v => (v - mean) * (v - mean)) / (draws.Length - 1));
            Assert.True(Math.Abs(t.Parameters[k] - truth[k]) < 3.5 * sd + 1e-4, $"parameter {k}: {t.Parameters[k]} vs {truth[k]} (sd {sd})");
            Assert.True(sd < 0.05);
        }
        Assert.Equal(150, t.Stars);
    }

    [Fact]
    public void Apply_NewModelInvertsTheTransformationExactly()
    {
        var r = CalibrationFitter.Run(SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 80 }, 42), SyntheticStandards.Options(bootstrap: 10));
        var t = FilterTransfer.Fit(Common(100, 43), bootstrap: 50, seed: 4);
        var newFilters = SyntheticStandards.Filters with { System = "invented-system-2", NarrowBand = "hk_inv2" };
        var m = FilterTransfer.Apply(r.Model, t, newFilters, seed: 5);
        Assert.Equal(newFilters, m.Filters);
        // f_new(C_new, F) = (f_old(a0 + a1 C_new, F) - b0 - b2 C_new) / b1 on the whole domain (a polynomial identity).
        foreach (var (cNew, f) in new[] { (0.8, -2.0), (1.0, -1.0), (1.3, -1.8), (0.9, -0.8) })
        {
            double expect = (r.Model.Evaluate(t.OldColour(cNew), f) - t.B0 - t.B2 * cNew) / t.B1;
            Assert.Equal(expect, m.Evaluate(cNew, f), 1e-9);
        }
        // Domain moved with the colour transformation.
        Assert.Equal(t.NewColour(r.Model.Domain.ColourMin), m.Domain.ColourMin, 1e-9);
        Assert.Equal(Math.Sqrt(r.Model.SigmaInt * r.Model.SigmaInt + t.IndexScatter * t.IndexScatter) / Math.Abs(t.B1), m.SigmaInt, 1e-12);
        Assert.InRange(t.IndexScatter, 0.0, 0.01); // the invented common stars have no scatter beyond their errors
        // Ensemble members carry their own drawn transformation: the spread grows beyond a fixed transformation's.
        Assert.Equal(r.Model.EnsembleCoefficients.Length, m.EnsembleCoefficients.Length);
        var fixedT = FilterTransfer.Apply(r.Model, t with { Ensemble = [] }, newFilters, seed: 5);
        double Spread(CalibrationModel x) => x.EnsembleCoefficients.Select(e => x.Basis.Value(e, 1.1, -1.5)).ToArray() is var v
            ? v.Max() - v.Min() : 0;
        Assert.True(Spread(m) >= Spread(fixedT) * 0.999);
        Assert.True(m.CoefficientCovariance[0] > fixedT.CoefficientCovariance[0]);
    }
}
