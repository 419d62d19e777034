using ItemReduce.Core.LinearAlgebra;

namespace ItemReduce.Core.Dimensions;

/// <summary>KMO result.</summary>
/// <param name="Overall">Overall measure of sampling adequacy in [0, 1].</param>
/// <param name="PerItem">MSA of each item (length p), in [0, 1].</param>
internal sealed record KaiserMeyerOlkinResult(double Overall, double[] PerItem);

/// <summary>
/// Kaiser–Meyer–Olkin measure of sampling adequacy: Kaiser (1970), "A second generation little jiffy",
/// Psychometrika 35(4), 401–415, and Kaiser (1974), "An index of factorial simplicity", Psychometrika 39(1),
/// 31–36. With partial (anti-image) correlations q_ij = −(R⁻¹)_ij / sqrt((R⁻¹)_ii (R⁻¹)_jj):
/// KMO = Σ_{i≠j} r_ij² / (Σ_{i≠j} r_ij² + Σ_{i≠j} q_ij²) and, per item,
/// MSA_j = Σ_{i≠j} r_ij² / (Σ_{i≠j} r_ij² + Σ_{i≠j} q_ij²). R must be positive definite.
/// </summary>
internal static class KaiserMeyerOlkin
{
    /// <summary>KMO and per-item MSA of the correlation matrix <paramref name="correlation"/> (p ≥ 2).</summary>
    public static KaiserMeyerOlkinResult Compute(double[,] correlation)
    {
        MatrixChecks.SymmetricFinite(correlation, nameof(correlation));
        int p = correlation.GetLength(0);
        if (p < 2) throw new DataConditionException($"KMO needs at least 2 items, got {p}.", nameof(correlation));
        var inv = CholeskyDecomposition.Inverse(correlation);
        var rowR = new double[p];
        var rowQ = new double[p];
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++)
            {
                if (i == j) continue;
                double q = -inv[i, j] / Math.Sqrt(inv[i, i] * inv[j, j]);
                rowR[i] += correlation[i, j] * correlation[i, j];
                rowQ[i] += q * q;
            }
        var msa = new double[p];
        for (int i = 0; i < p; i++) msa[i] = rowR[i] / (rowR[i] + rowQ[i]);
        double sr = rowR.Sum(), sq = rowQ.Sum();
        return new KaiserMeyerOlkinResult(sr / (sr + sq), msa);
    }
}
