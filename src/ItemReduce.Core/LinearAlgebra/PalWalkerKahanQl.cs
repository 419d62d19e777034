using System.Runtime.CompilerServices;

namespace ItemReduce.Core.LinearAlgebra;

/// <summary>
/// Eigenvalues only of a symmetric tridiagonal matrix by the root-free QL/QR iteration of Pal, Walker and Kahan, which
/// works on the squared off-diagonal elements and needs no square root per rotation (one division instead of a square
/// root and two divisions in <see cref="SymmetricEigensolver.ImplicitQl"/>): described in Parlett (1998), The Symmetric
/// Eigenvalue Problem, ch. 8 (the square-root-free variants of the QL algorithm); the splitting tests, the choice
/// between QL and QR by the end with the smaller diagonal element, the scaling of a block into the safe range and the
/// 2 × 2 blocks follow LAPACK's eigenvalues-only tridiagonal routine as we remember it (Anderson et al., 1999, LAPACK
/// Users' Guide; written from memory, not copied). Wilkinson's shift; at most 30·n sweeps in all.
/// </summary>
internal static class PalWalkerKahanQl
{
    /// <summary>Sweeps allowed per eigenvalue on average (the whole matrix gets 30·n).</summary>
    public const int MaxSweepsPerEigenvalue = 30;

    private const double Eps = 1.1102230246251565e-16; // 2^-53, unit roundoff
    private const double Eps2 = Eps * Eps;
    private const double SafeMin = 2.2250738585072014e-308; // smallest normal double

    /// <summary>
    /// Overwrites <paramref name="d"/> (the diagonal, length n) with the eigenvalues in no particular order;
    /// <paramref name="e"/> holds on entry the sub-diagonal as <see cref="SymmetricEigensolver.HouseholderTridiagonalize"/>
    /// leaves it (e[i] = T[i, i−1], e[0] unused) and is destroyed.
    /// </summary>
    /// <exception cref="NonConvergenceException">The iteration exceeded 30·n sweeps.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void Eigenvalues(double[] d, double[] e, int n)
    {
        if (n <= 1) return;
        for (int i = 1; i < n; i++) e[i - 1] = e[i]; // e[k] now couples d[k] and d[k + 1]
        e[n - 1] = 0;
        double ssfmax = Math.Sqrt(1 / SafeMin) / 3, ssfmin = Math.Sqrt(SafeMin) / Eps2;
        int maxSweeps = MaxSweepsPerEigenvalue * n, sweeps = 0, l1 = 0;
        while (l1 < n)
        {
            if (l1 > 0) e[l1 - 1] = 0;
            int m = l1;
            while (m < n - 1 && !(Math.Abs(e[m]) <= Math.Sqrt(Math.Abs(d[m])) * Math.Sqrt(Math.Abs(d[m + 1])) * Eps)) m++;
            if (m < n - 1) e[m] = 0;
            int l = l1, lsv = l, lend = m, lendsv = lend;
            l1 = m + 1;
            if (lend == l) continue;
            double anorm = 0;
            for (int i = l; i <= lend; i++) anorm = Math.Max(anorm, Math.Abs(d[i]));
            for (int i = l; i < lend; i++) anorm = Math.Max(anorm, Math.Abs(e[i]));
            if (anorm == 0) continue;
            double scale = anorm > ssfmax ? ssfmax / anorm : anorm < ssfmin ? ssfmin / anorm : 1;
            if (scale != 1) Scale(d, e, l, lend, scale);
            for (int i = l; i < lend; i++) e[i] *= e[i];
            if (Math.Abs(d[lend]) < Math.Abs(d[l])) (l, lend) = (lendsv, lsv);
            sweeps = lend >= l ? QlBlock(d, e, l, lend, sweeps, maxSweeps) : QrBlock(d, e, l, lend, sweeps, maxSweeps);
            if (scale != 1)
                for (int i = lsv; i <= lendsv; i++) d[i] /= scale;
            if (sweeps >= maxSweeps)
                throw new NonConvergenceException(
                    $"Root-free QL iteration did not converge within {maxSweeps} sweeps for a {n} × {n} tridiagonal matrix.");
        }
    }

    private static void Scale(double[] d, double[] e, int l, int lend, double scale)
    {
        for (int i = l; i <= lend; i++) d[i] *= scale;
        for (int i = l; i < lend; i++) e[i] *= scale;
    }

    /// <summary>QL sweeps on the unreduced block l..lend (l ≤ lend; e holds squares), deflating from the top.</summary>
    private static int QlBlock(double[] d, double[] e, int l, int lend, int sweeps, int maxSweeps)
    {
        while (true)
        {
            int m = l;
            while (m < lend && !(Math.Abs(e[m]) <= Eps2 * Math.Abs(d[m] * d[m + 1]))) m++;
            if (m < lend) e[m] = 0;
            double p = d[l];
            if (m == l)
            {
                l++;
                if (l <= lend) continue;
                return sweeps;
            }
            if (m == l + 1)
            {
                (d[l], d[l + 1]) = TwoByTwo(d[l], Math.Sqrt(e[l]), d[l + 1]);
                e[l] = 0;
                l += 2;
                if (l <= lend) continue;
                return sweeps;
            }
            if (sweeps == maxSweeps) return sweeps;
            sweeps++;
            double rte = Math.Sqrt(e[l]);
            double sigma = (d[l + 1] - p) / (2 * rte);
            double r = SymmetricEigensolver.Hypot(sigma, 1);
            sigma = p - rte / (sigma + (sigma >= 0 ? r : -r));
            double c = 1, s = 0, gamma = d[m] - sigma;
            p = gamma * gamma;
            for (int i = m - 1; i >= l; i--)
            {
                double bb = e[i];
                r = p + bb;
                if (i != m - 1) e[i + 1] = s * r;
                double oldc = c, invR = 1 / r, rOverP = r / p; // both divisions start as soon as p is known
                c = p * invR;
                s = bb * invR;
                double oldgam = gamma, alpha = d[i];
                gamma = c * (alpha - sigma) - s * oldgam;
                d[i + 1] = oldgam + (alpha - gamma);
                p = c != 0 ? gamma * gamma * rOverP : oldc * bb;
            }
            e[l] = s * p;
            d[l] = sigma + gamma;
        }
    }

    /// <summary>QR sweeps on the unreduced block lend..l (lend &lt; l; e holds squares), deflating from the bottom.</summary>
    private static int QrBlock(double[] d, double[] e, int l, int lend, int sweeps, int maxSweeps)
    {
        while (true)
        {
            int m = l;
            while (m > lend && !(Math.Abs(e[m - 1]) <= Eps2 * Math.Abs(d[m] * d[m - 1]))) m--;
            if (m > lend) e[m - 1] = 0;
            double p = d[l];
            if (m == l)
            {
                l--;
                if (l >= lend) continue;
                return sweeps;
            }
            if (m == l - 1)
            {
                (d[l], d[l - 1]) = TwoByTwo(d[l], Math.Sqrt(e[l - 1]), d[l - 1]);
                e[l - 1] = 0;
                l -= 2;
                if (l >= lend) continue;
                return sweeps;
            }
            if (sweeps == maxSweeps) return sweeps;
            sweeps++;
            double rte = Math.Sqrt(e[l - 1]);
            double sigma = (d[l - 1] - p) / (2 * rte);
            double r = SymmetricEigensolver.Hypot(sigma, 1);
            sigma = p - rte / (sigma + (sigma >= 0 ? r : -r));
            double c = 1, s = 0, gamma = d[m] - sigma;
            p = gamma * gamma;
            for (int i = m; i < l; i++)
            {
                double bb = e[i];
                r = p + bb;
                if (i != m) e[i - 1] = s * r;
                double oldc = c, invR = 1 / r, rOverP = r / p;
                c = p * invR;
                s = bb * invR;
                double oldgam = gamma, alpha = d[i + 1];
                gamma = c * (alpha - sigma) - s * oldgam;
                d[i] = oldgam + (alpha - gamma);
                p = c != 0 ? gamma * gamma * rOverP : oldc * bb;
            }
            e[l - 1] = s * p;
            d[l] = sigma + gamma;
        }
    }

    /// <summary>Eigenvalues of [[a, b], [b, c]], the larger in absolute value first, computed without cancellation
    /// (the smaller from the determinant).</summary>
    internal static (double Larger, double Smaller) TwoByTwo(double a, double b, double c)
    {
        double sm = a + c, adf = Math.Abs(a - c), ab = Math.Abs(b + b);
        double acmx = Math.Abs(a) > Math.Abs(c) ? a : c, acmn = Math.Abs(a) > Math.Abs(c) ? c : a;
        double rt = adf > ab ? adf * Math.Sqrt(1 + (ab / adf) * (ab / adf))
            : adf < ab ? ab * Math.Sqrt(1 + (adf / ab) * (adf / ab)) : ab * Math.Sqrt(2.0);
        if (sm == 0) return (0.5 * rt, -0.5 * rt);
        double rt1 = sm < 0 ? 0.5 * (sm - rt) : 0.5 * (sm + rt);
        return (rt1, acmx / rt1 * acmn - b / rt1 * b);
    }
}
