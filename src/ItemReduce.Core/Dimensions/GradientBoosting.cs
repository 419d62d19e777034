namespace ItemReduce.Core.Dimensions;

/// <summary>
/// K-class gradient boosting of regression trees: Friedman, J. H. (2001). Greedy function approximation: A gradient
/// boosting machine. The Annals of Statistics, 29(5), 1189–1232 (its K-class logistic version).
/// Start: log of the class shares (kept in [ε, 1 − ε], ε of single precision). Each round fits, per class k, one
/// regression tree to the residuals y_k − p_k (probabilities from the previous round), grown depth first with the split
/// that maximises n_L·n_R/(n_L + n_R)·(mean_L − mean_R)² (Friedman's improvement criterion), features visited in
/// order (the first of equal splits wins), cut points halfway between neighbouring distinct values with features held
/// in single precision; each leaf takes the Newton step (K − 1)/K · Σr / Σ p(1 − p), shrunk by the learning rate.
/// These are the choices of scikit-learn's GradientBoostingClassifier (loss "log_loss", criterion "friedman_mse"),
/// which the unit tests use as the outside reference. Used by the study program to fit <see cref="CombinedRetention"/>;
/// the tool itself only evaluates the fitted <see cref="BoostedTrees"/>.
/// </summary>
internal static class GradientBoosting
{
    /// <summary>Machine epsilon of single precision: class shares are kept in [ε, 1 − ε] before the logarithm.</summary>
    private const double SingleEpsilon = 1.1920928955078125e-07;

    /// <summary>Machine epsilon of double precision: a node whose residuals vary less is a leaf.</summary>
    private const double DoubleEpsilon = 2.220446049250313e-16;

    /// <summary>Values closer than this (in double precision) count as equal when looking for cut points.</summary>
    private const double FeatureThreshold = 1e-7;

    /// <summary>Fits <paramref name="rounds"/> rounds on features <paramref name="x"/> and class indices <paramref name="label"/>
    /// (0 … <paramref name="classes"/> − 1, every class present), trees of depth ≤ <paramref name="depth"/>.</summary>
    /// <exception cref="ArgumentException">A class does not occur, or the rows are empty or ragged.</exception>
    public static BoostedTrees Fit(double[][] x, int[] label, int classes, int rounds, double learningRate, int depth)
    {
        ArgumentNullException.ThrowIfNull(x);
        ArgumentNullException.ThrowIfNull(label);
        if (x.Length == 0 || x.Length != label.Length || x.Any(r => r.Length != x[0].Length))
            throw new ArgumentException("Training rows must be non-empty, of equal length, one label each.", nameof(x));
        int n = x.Length, f = x[0].Length, slots = (1 << (depth + 1)) - 1;
        var xf = x.Select(r => r.Select(v => (float)v).ToArray()).ToArray();
        var init = new double[classes];
        for (int c = 0; c < classes; c++)
        {
            double share = (double)label.Count(l => l == c) / n;
            if (share == 0) throw new ArgumentException($"Class {c} does not occur in the training rows.", nameof(label));
            init[c] = Math.Log(Math.Clamp(share, SingleEpsilon, 1 - SingleEpsilon));
        }
        var raw = new double[n][];
        for (int i = 0; i < n; i++) raw[i] = (double[])init.Clone();
        var feature = new int[rounds * classes * slots];
        var value = new double[rounds * classes * slots];
        Array.Fill(feature, BoostedTrees.Unused);
        var rows = Enumerable.Range(0, n).ToArray();
        for (int it = 0; it < rounds; it++)
        {
            var prob = raw.Select(Softmax).ToArray();
            for (int c = 0; c < classes; c++)
            {
                var residual = new double[n];
                for (int i = 0; i < n; i++) residual[i] = (label[i] == c ? 1 : 0) - prob[i][c];
                int offset = (it * classes + c) * slots;
                var leafOf = new int[n];
                Grow(xf, residual, rows, depth, 0, offset, feature, value, leafOf, f);
                // Newton step per leaf.
                var num = new Dictionary<int, double>();
                var den = new Dictionary<int, double>();
                foreach (int i in rows)
                {
                    double y = label[i] == c ? 1 : 0, r = residual[i];
                    num[leafOf[i]] = num.GetValueOrDefault(leafOf[i]) + r;
                    den[leafOf[i]] = den.GetValueOrDefault(leafOf[i]) + (y - r) * (1 - y + r);
                }
                foreach (int leaf in num.Keys)
                {
                    double nu = num[leaf] * (classes - 1) / classes, de = den[leaf];
                    value[offset + leaf] = Math.Abs(de) < 1e-150 ? 0 : nu / de;
                }
                for (int i = 0; i < n; i++) raw[i][c] += learningRate * value[offset + leafOf[i]];
            }
        }
        return new BoostedTrees(init, learningRate, classes, slots, feature, value);
    }

    private static double[] Softmax(double[] raw)
    {
        double top = raw.Max(), sum = 0;
        foreach (double r in raw) sum += Math.Exp(r - top);
        double log = top + Math.Log(sum);
        return raw.Select(r => Math.Exp(r - log)).ToArray();
    }

    /// <summary>Grows the subtree at heap slot <paramref name="slot"/> on <paramref name="rows"/>; records each row's leaf.</summary>
    private static void Grow(float[][] x, double[] y, int[] rows, int levelsLeft, int slot, int offset, int[] feature, double[] value,
        int[] leafOf, int features)
    {
        int n = rows.Length;
        double sum = 0, squares = 0;
        foreach (int i in rows) { sum += y[i]; squares += y[i] * y[i]; }
        double impurity = squares / n - (sum / n) * (sum / n);
        int bestFeature = -1, bestPos = -1;
        double bestProxy = double.NegativeInfinity, bestThreshold = 0;
        int[]? bestOrder = null;
        if (levelsLeft > 0 && n >= 2 && impurity > DoubleEpsilon)
        {
            for (int j = 0; j < features; j++)
            {
                var order = rows.OrderBy(i => x[i][j]).ToArray();
                if (x[order[^1]][j] <= x[order[0]][j] + FeatureThreshold) continue;
                double left = 0;
                int pos = 0;
                while (pos < n)
                {
                    while (pos + 1 < n && x[order[pos + 1]][j] <= x[order[pos]][j] + FeatureThreshold)
                    {
                        left += y[order[pos]];
                        pos++;
                    }
                    left += y[order[pos]];
                    pos++;
                    if (pos >= n) break;
                    double nl = pos, nr = n - pos, right = sum - left;
                    double diff = nr * left - nl * right;
                    double proxy = diff * diff / (nl * nr);
                    if (proxy > bestProxy)
                    {
                        bestProxy = proxy;
                        bestFeature = j;
                        bestPos = pos;
                        bestOrder = order;
                        double a = x[order[pos - 1]][j], b = x[order[pos]][j];
                        bestThreshold = a / 2.0 + b / 2.0;
                        if (bestThreshold == b || double.IsInfinity(bestThreshold)) bestThreshold = a;
                    }
                }
            }
        }
        if (bestFeature < 0)
        {
            feature[offset + slot] = BoostedTrees.Leaf;
            foreach (int i in rows) leafOf[i] = slot;
            return;
        }
        feature[offset + slot] = bestFeature;
        value[offset + slot] = bestThreshold;
        var leftRows = bestOrder![..bestPos].Order().ToArray();
        var rightRows = bestOrder[bestPos..].Order().ToArray();
        Grow(x, y, leftRows, levelsLeft - 1, 2 * slot + 1, offset, feature, value, leafOf, features);
        Grow(x, y, rightRows, levelsLeft - 1, 2 * slot + 2, offset, feature, value, leafOf, features);
    }
}
