using ItemReduce.Core.Data;

namespace ItemReduce.Core.Correlation;

/// <summary>
/// Pearson product-moment correlation matrix of the items (Pearson, 1896, "Mathematical contributions to
/// the theory of evolution III", Phil. Trans. R. Soc. A 187, 253–318). Pairwise: each pair uses the
/// respondents who answered both items, with that pair's own means and SDs (two-pass). Listwise: only
/// complete rows. Returns a p × p symmetric matrix with unit diagonal; a pair with fewer than 3 joint
/// answers or zero variance gives NaN.
/// </summary>
public static class PearsonCorrelation
{
    /// <summary>Correlation matrix of the columns of <paramref name="data"/>.</summary>
    public static double[,] Compute(ResponseMatrix data, MissingDataHandling handling = MissingDataHandling.Pairwise)
    {
        ArgumentNullException.ThrowIfNull(data);
        if (handling == MissingDataHandling.Listwise || !data.HasMissing())
        {
            var rows = new List<int>();
            for (int i = 0; i < data.RespondentCount; i++)
            {
                bool complete = true;
                foreach (double x in data.Row(i)) if (double.IsNaN(x)) { complete = false; break; }
                if (complete) rows.Add(i);
            }
            return rows.Count == data.RespondentCount ? Complete(data.Storage, data.RespondentCount, data.ItemCount)
                : Complete(data.SelectRespondents(rows).Storage, rows.Count, data.ItemCount);
        }
        return Pairwise(data.Storage, data.RespondentCount, data.ItemCount);
    }

    /// <summary>Correlations of complete data: centre columns (two-pass), then cross-products.</summary>
    internal static double[,] Complete(double[] v, int n, int p)
    {
        var mean = new double[p];
        for (int i = 0; i < n; i++)
            for (int j = 0; j < p; j++) mean[j] += v[i * p + j];
        for (int j = 0; j < p; j++) mean[j] /= n;
        var cp = new double[p, p];
        var d = new double[p];
        for (int i = 0; i < n; i++)
        {
            int o = i * p;
            for (int j = 0; j < p; j++) d[j] = v[o + j] - mean[j];
            for (int j = 0; j < p; j++)
            {
                double dj = d[j];
                for (int k = 0; k <= j; k++) cp[j, k] += dj * d[k];
            }
        }
        var r = new double[p, p];
        for (int j = 0; j < p; j++)
        {
            for (int k = 0; k < j; k++)
            {
                double den = Math.Sqrt(cp[j, j] * cp[k, k]);
                double c = den > 0 && n >= 3 ? cp[j, k] / den : double.NaN;
                r[j, k] = r[k, j] = c;
            }
            r[j, j] = 1.0;
        }
        return r;
    }

    private static double[,] Pairwise(double[] v, int n, int p)
    {
        var r = new double[p, p];
        for (int j = 0; j < p; j++)
        {
            r[j, j] = 1.0;
            for (int k = 0; k < j; k++)
            {
                int m = 0;
                double sj = 0, sk = 0;
                for (int i = 0; i < n; i++)
                {
                    double a = v[i * p + j], b = v[i * p + k];
                    if (double.IsNaN(a) || double.IsNaN(b)) continue;
                    m++; sj += a; sk += b;
                }
                if (m < 3) { r[j, k] = r[k, j] = double.NaN; continue; }
                double mj = sj / m, mk = sk / m, cjj = 0, ckk = 0, cjk = 0;
                for (int i = 0; i < n; i++)
                {
                    double a = v[i * p + j], b = v[i * p + k];
                    if (double.IsNaN(a) || double.IsNaN(b)) continue;
                    double da = a - mj, db = b - mk;
                    cjj += da * da; ckk += db * db; cjk += da * db;
                }
                double den = Math.Sqrt(cjj * ckk);
                r[j, k] = r[k, j] = den > 0 ? cjk / den : double.NaN;
            }
        }
        return r;
    }
}
