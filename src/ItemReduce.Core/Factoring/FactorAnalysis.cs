using System.Globalization;
using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// Façade: exploratory common-factor analysis of a correlation matrix — extraction
/// (<see cref="FactorExtraction"/>), rotation (<see cref="FactorRotation"/>), sign/order alignment and
/// labelling (<see cref="FactorAlignment"/>), Heywood and convergence checks, and ML fit statistics.
/// </summary>
internal static class FactorAnalysis
{
    /// <summary>
    /// Fits k common factors to the p × p correlation matrix <paramref name="correlation"/> of
    /// <paramref name="respondents"/> respondents.
    /// </summary>
    /// <param name="correlation">Symmetric p × p correlation matrix, unit diagonal, finite entries.</param>
    /// <param name="respondents">Number of respondents (used for ML fit statistics only); ≥ 2.</param>
    /// <param name="factors">Number of factors k, 1 ≤ k &lt; p.</param>
    /// <param name="options">Options; null = defaults (minres, oblimin).</param>
    /// <exception cref="ArgumentException">Invalid matrix, n, k or options; for ML also a correlation matrix
    /// that is not positive definite.</exception>
    /// <exception cref="FactorNonConvergenceException">A rotation became singular.</exception>
    public static FactorSolution Fit(double[,] correlation, int respondents, int factors, FactoringOptions? options = null)
    {
        var o = options ?? new FactoringOptions();
        Validate(correlation, respondents, factors, o);
        var r = MatrixHelpers.ToMatrix(correlation);
        if (o.Extraction == FactorExtraction.MaximumLikelihood && !MatrixHelpers.IsPositiveDefinite(r, out _))
            throw new DataConditionException("Maximum likelihood needs a positive definite correlation matrix; this one is not " +
                                        "(pairwise deletion, linearly dependent or duplicated items?). Use minres or principal axis.", nameof(correlation));
        var extraction = Extract(r, factors, o);
        var rotation = Rotate(extraction.Loadings, factors, o);
        var (pattern, phi) = FactorAlignment.AlignSignsAndOrder(rotation.Pattern, rotation.Phi);
        var structure = pattern * phi;
        int p = r.RowCount;
        var h2 = new double[p];
        var psi = new double[p];
        for (int j = 0; j < p; j++)
        {
            for (int f = 0; f < factors; f++) h2[j] += pattern[j, f] * structure[j, f];
            psi[j] = 1.0 - h2[j];
        }
        var ve = new double[factors];
        var ssp = new double[factors];
        for (int f = 0; f < factors; f++)
            for (int j = 0; j < p; j++) { ve[f] += pattern[j, f] * structure[j, f]; ssp[f] += pattern[j, f] * pattern[j, f]; }

        var heywood = extraction.AtLowerBound.Union(Enumerable.Range(0, p).Where(j => h2[j] >= 1 - 1e-3)).OrderBy(j => j).ToList();
        var warnings = new WarningList("factoring");
        if (!extraction.Converged)
            warnings.Add("extraction-not-converged", $"{o.Extraction} extraction did not converge within {o.MaxIterations} iterations; treat the loadings as provisional.");
        if (!rotation.Converged)
            warnings.Add("rotation-not-converged", $"{o.Rotation} rotation did not converge within {o.MaxIterations} iterations; treat the rotated loadings as provisional.");
        if (heywood.Count > 0)
            warnings.Add("heywood-case", "Heywood case (communality at or above 1) for item(s) " +
                         string.Join(", ", heywood.Select(j => o.ItemNames is { } names && names.Count == correlation.GetLength(0)
                             ? names[j] : (j + 1).ToString(CultureInfo.InvariantCulture))) +
                         ": too many factors, too few respondents or a near-duplicate item; interpret with care.");

        var patternArray = pattern.ToArray();
        FactorModelFit? fit = o.Extraction == FactorExtraction.MaximumLikelihood
            ? MaximumLikelihoodFactoring.FitStatistics(r, respondents, factors, extraction.Objective) : null;
        if (fit is { Df: <= 0 })
            warnings.Add("fit-undefined", $"The {factors}-factor model has {fit.Df.ToString(CultureInfo.InvariantCulture)} degrees of freedom; the χ² test, RMSEA and TLI are undefined.");
        return new FactorSolution
        {
            Pattern = patternArray,
            Structure = structure.ToArray(),
            FactorCorrelations = phi.ToArray(),
            Unrotated = extraction.Loadings.ToArray(),
            Communalities = h2,
            Uniquenesses = psi,
            VarianceExplained = ve,
            SumSquaredPattern = ssp,
            Extraction = o.Extraction,
            Rotation = factors == 1 ? FactorRotation.None : o.Rotation,
            Converged = extraction.Converged && rotation.Converged,
            Iterations = extraction.Iterations,
            RotationIterations = rotation.Iterations,
            HeywoodItems = heywood,
            Fit = fit,
            FactorLabels = FactorAlignment.Labels(patternArray, o.ItemSubscales),
            SubscaleFactor = FactorAlignment.SubscaleHomeFactors(patternArray, o.ItemSubscales),
            Warnings = warnings,
        };
    }

    internal static ExtractionResult Extract(Matrix<double> r, int k, FactoringOptions o) => o.Extraction switch
    {
        FactorExtraction.MinimumResidual => MinimumResidual.Extract(r, k, o),
        FactorExtraction.PrincipalAxis => PrincipalAxisFactoring.Extract(r, k, o),
        FactorExtraction.MaximumLikelihood => MaximumLikelihoodFactoring.Extract(r, k, o),
        _ => throw new ArgumentException($"Unknown extraction {o.Extraction}.", nameof(o)),
    };

    internal static RotationResult Rotate(Matrix<double> a, int k, FactoringOptions o)
    {
        if (k == 1 || o.Rotation == FactorRotation.None)
            return new RotationResult(a, Matrix<double>.Build.DenseIdentity(k), true, 0, double.NaN);
        return o.Rotation switch
        {
            FactorRotation.Varimax => Varimax.Rotate(a, o.KaiserNormalization, o.MaxIterations, o.Tolerance),
            FactorRotation.Oblimin => Oblimin.Rotate(a, o.ObliminGamma, o.KaiserNormalization, o.MaxIterations, o.Tolerance),
            FactorRotation.Promax => Promax.Rotate(a, o.PromaxPower, o.KaiserNormalization, o.MaxIterations, o.Tolerance),
            _ => throw new ArgumentException($"Unknown rotation {o.Rotation}.", nameof(o)),
        };
    }

    private static void Validate(double[,] r, int n, int k, FactoringOptions o)
    {
        ArgumentNullException.ThrowIfNull(r);
        int p = r.GetLength(0);
        if (r.GetLength(1) != p) throw new ArgumentException($"Correlation matrix must be square; got {p}×{r.GetLength(1)}.", nameof(r));
        if (p < 2) throw new DataConditionException($"Need at least 2 items; got {p}.", nameof(r));
        for (int i = 0; i < p; i++)
        {
            if (Math.Abs(r[i, i] - 1.0) > 1e-8) throw new ArgumentException($"Diagonal entry [{i},{i}] = {r[i, i]}; a correlation matrix has 1 there.", nameof(r));
            for (int j = 0; j < p; j++)
            {
                if (!double.IsFinite(r[i, j])) throw new DataConditionException($"Entry [{i},{j}] is {r[i, j]}; all entries must be finite (too few joint answers?).", nameof(r));
                if (Math.Abs(r[i, j] - r[j, i]) > 1e-10) throw new ArgumentException($"Matrix is not symmetric at [{i},{j}].", nameof(r));
            }
        }
        if (n < 2) throw new ArgumentException($"n = {n}; must be ≥ 2.", nameof(n));
        if (k < 1 || k >= p) throw new DataConditionException($"factors = {k}; allowed range is 1..{p - 1} for {p} items.", nameof(k));
        if (o.MaxIterations is < 10 or > 100000) throw new ArgumentException($"MaxIterations = {o.MaxIterations}; allowed 10..100000.", nameof(o));
        if (!(o.Tolerance > 0 && o.Tolerance <= 1e-2)) throw new ArgumentException($"Tolerance = {o.Tolerance}; allowed (0, 0.01].", nameof(o));
        if (!(o.UniquenessLowerBound > 0 && o.UniquenessLowerBound <= 0.1)) throw new ArgumentException($"UniquenessLowerBound = {o.UniquenessLowerBound}; allowed (0, 0.1].", nameof(o));
        if (!(o.ObliminGamma >= -10 && o.ObliminGamma <= 1)) throw new ArgumentException($"ObliminGamma = {o.ObliminGamma}; allowed [−10, 1].", nameof(o));
        if (!(o.PromaxPower >= 2 && o.PromaxPower <= 10)) throw new ArgumentException($"PromaxPower = {o.PromaxPower}; allowed [2, 10].", nameof(o));
        if (o.ItemSubscales is { } s && s.Count != p) throw new ArgumentException($"ItemSubscales has {s.Count} entries; the matrix has {p} items.", nameof(o));
    }
}
