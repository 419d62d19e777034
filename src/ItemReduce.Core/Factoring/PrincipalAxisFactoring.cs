using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// Principal axis factoring with iterated communalities (Thurstone's principal-factor method as described in
/// Harman, H. H. (1976). Modern Factor Analysis, 3rd ed., University of Chicago Press, ch. 8): start from
/// squared multiple correlations, put the communalities on the diagonal of R, take the leading k
/// eigenpairs, recompute communalities as row sums of squared loadings, repeat until the largest change is
/// below the tolerance. Communalities above 1 are not clipped: they are reported as Heywood cases.
/// </summary>
internal static class PrincipalAxisFactoring
{
    public static ExtractionResult Extract(Matrix<double> r, int k, FactoringOptions o)
    {
        int p = r.RowCount;
        var h2 = MatrixHelpers.SquaredMultipleCorrelations(r);
        Matrix<double> loadings = Matrix<double>.Build.Dense(p, k);
        bool converged = false;
        int it = 0;
        while (it < o.MaxIterations)
        {
            it++;
            var reduced = r.Clone();
            for (int j = 0; j < p; j++) reduced[j, j] = h2[j];
            var (e, v) = MatrixHelpers.LeadingEigen(reduced, k);
            loadings = MatrixHelpers.PrincipalLoadings(e, v, k);
            var next = MatrixHelpers.RowSumSquares(loadings);
            double change = 0;
            for (int j = 0; j < p; j++) change = Math.Max(change, Math.Abs(next[j] - h2[j]));
            h2 = next;
            if (change < o.Tolerance) { converged = true; break; }
        }
        var psi = new double[p];
        var heywood = new List<int>();
        for (int j = 0; j < p; j++)
        {
            psi[j] = r[j, j] - h2[j];
            if (h2[j] >= r[j, j] - 1e-3) heywood.Add(j);
        }
        return new ExtractionResult(loadings, psi, converged, it, heywood, double.NaN);
    }
}
