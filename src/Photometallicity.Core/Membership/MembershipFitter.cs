using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;

namespace Photometallicity.Membership;

/// <summary>
/// The Membership stage: fits the two-component mixture (target: elliptical profile on the field's footprint x
/// red-giant ridge x metallicity Gaussian [x proper motion, parallax]; foreground: uniform on the footprint x
/// empirical CMD density from the outer region x broad metallicity Gaussian [x broad astrometry]) by EM
/// (<see cref="MixtureEm"/>) and returns each star's membership probability, the structure and the members' MDF.
/// The foreground CMD density is first taken from all outer stars, then, once the fit has converged, rebuilt
/// from the outer stars weighted by 1 - p (removing the target's own outskirts) and the fit re-converged.
/// A foreground-only model is fitted too, and the likelihood-ratio statistic tells whether a target is present.
/// No random numbers are drawn (the options' seed is not needed by this fit).
/// </summary>
public static class MembershipFitter
{
    /// <summary>p-value below which a target counts as detected (3 sigma, one-sided Gaussian; common practice).</summary>
    public const double DetectionPValue = 2.7e-3;

    public static MembershipResult Run(MembershipInputs inputs, MembershipOptions options, ILogger? logger = null)
    {
        logger ??= NullLogger.Instance;
        inputs.Validate();
        options.Validate();
        var warnings = new List<string>();
        var plane = new TangentPlane(options.InitialCentre);
        var d = MixtureData.Prepare(inputs, plane);
        var setup = MixtureSetup.Create(d, options, warnings);
        logger.LogInformation("membership: {Stars} stars with positions, footprint {Area:F1} arcmin^2, {Outer} outer stars for the foreground CMD",
            d.Positioned.Length, d.Footprint.Area, setup.OuterCount);

        var primary = FitMode(d, setup, options, options.UseMetallicity, setup.Initial.Clone(), warnings);
        MixtureFit? secondary = null;
        bool anyFeh = d.Feh is not null && d.FehRows.Length > 0;
        if (anyFeh && options.FitBothMetallicityModes)
            secondary = FitMode(d, setup, options, !options.UseMetallicity, primary.Parameters.Clone(), null, keepTerms: false);
        var withTerm = options.UseMetallicity ? primary : secondary;
        var withoutTerm = options.UseMetallicity ? secondary : primary;
        MdfFit? mdfWith = null, mdfWithout = null;
        if (anyFeh)
        {
            if (withTerm is not null)
                mdfWith = MdfEstimator.WithErrors(d.Feh!, withTerm.R, d.FehRows, withTerm.Parameters.MdfMean, withTerm.Parameters.MdfSigma,
                    options.MaxThreads, withTerm.Converged);
            if (withoutTerm is not null)
                mdfWithout = MdfAfterwards(d, withoutTerm.R, options.MaxThreads);
        }
        else warnings.Add("no star has a [Fe/H] likelihood: the metallicity distribution is not fitted");
        var mdf = options.UseMetallicity ? mdfWith : mdfWithout;
        if (mdf is { SigmaAtFloor: true })
            warnings.Add($"the intrinsic [Fe/H] spread is unresolved: it sits at its lower bound of {mdf.Sigma:F3} dex (one grid step)");
        if (mdf is not null)
            logger.LogInformation("membership: MDF mean {Mean:F3} +/- {MeanErr:F3} dex, sigma {Sigma:F3} +/- {SigmaErr:F3} dex", mdf.Mean, mdf.MeanErr, mdf.Sigma, mdf.SigmaErr);

        var result = MembershipReport.Build(d, setup, options, primary, warnings);
        logger.LogInformation("membership: expected members {N:F1}, 2 dlnL = {Ts:F1} against no target, {It} EM iterations",
            result.ExpectedMembers, result.TestStatistic, result.Iterations);
        return result with
        {
            Mdf = mdf,
            MdfWithMetallicityTerm = mdfWith,
            MdfWithoutMetallicityTerm = mdfWithout,
        };
    }

    /// <summary>The MDF fitted afterwards to the members, each weighted by its membership probability.</summary>
    private static MdfFit MdfAfterwards(MixtureData d, double[] p, int threads)
    {
        double s = 0, sw = 0;
        foreach (int i in d.FehRows)
        {
            double m = d.FehMean(i);
            if (double.IsFinite(m)) { s += p[i] * m; sw += p[i]; }
        }
        double mu0 = sw > 0 ? s / sw : -1.5;
        return MdfEstimator.Fit(d.Feh!, p, d.FehRows, mu0, 0.3, threads);
    }

    private static MixtureFit FitMode(MixtureData d, MixtureSetup setup, MembershipOptions o, bool useFeh, MixtureParameters p, List<string>? warnings,
        bool keepTerms = true)
    {
        // Only the primary fit is reported with structural uncertainties, which need the per-star terms.
        var em = new MixtureEm(d, setup.Bounds, useFeh, o.MaxThreads, keepTerms);
        var fgCmd = setup.ForegroundCmdLog(null);
        var (it1, c1) = em.Iterate(p, fgCmd, o.MaxIterations, o.Tolerance);
        // second stage: foreground CMD from the outer region with the target's outskirts weighted out
        fgCmd = setup.ForegroundCmdLog((em.R, p.Profile));
        var (it2, c2) = em.Iterate(p, fgCmd, o.MaxIterations, o.Tolerance);
        bool converged = c1 && c2;
        if (!converged)
            warnings?.Add($"the membership EM did not converge within {o.MaxIterations} iterations");
        return new MixtureFit(p, em, fgCmd, it1 + it2, converged);
    }
}

/// <summary>A converged (or stopped) mixture fit of one metallicity mode.</summary>
internal sealed record MixtureFit(MixtureParameters Parameters, MixtureEm Em, double[] ForegroundCmdLog, int Iterations, bool Converged)
{
    public double[] R => Em.R;
}
