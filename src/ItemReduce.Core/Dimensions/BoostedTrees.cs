namespace ItemReduce.Core.Dimensions;

/// <summary>
/// A fitted K-class gradient-boosted tree ensemble (Friedman, J. H. (2001). Greedy function approximation: A gradient
/// boosting machine. The Annals of Statistics, 29(5), 1189–1232): the score of class k is
/// <c>Start[k] + LearningRate · Σ_t leaf value of tree (t, k)</c>, trees stored round by round and class by class in
/// heap order (slot s has children 2s + 1 and 2s + 2). At an internal slot <see cref="Feature"/> names the feature and
/// <see cref="Value"/> the cut point (features compared in single precision, "≤ cut" goes left, as the model was
/// fitted); at a leaf <see cref="Feature"/> is <see cref="Leaf"/> and <see cref="Value"/> the leaf value.
/// </summary>
/// <param name="Start">Start score per class (log of the class shares in the training table).</param>
/// <param name="LearningRate">Shrinkage applied to every leaf value.</param>
/// <param name="Classes">Number of classes K.</param>
/// <param name="Slots">Slots per tree (2^(depth + 1) − 1).</param>
/// <param name="Feature">Per slot: feature index, <see cref="Leaf"/> or <see cref="Unused"/>.</param>
/// <param name="Value">Per slot: cut point or leaf value.</param>
public sealed record BoostedTrees(double[] Start, double LearningRate, int Classes, int Slots, int[] Feature, double[] Value)
{
    /// <summary>Marks a leaf slot.</summary>
    public const int Leaf = -1;

    /// <summary>Marks a slot below a leaf.</summary>
    public const int Unused = -2;

    /// <summary>Class scores (log-odds up to a common constant) of one feature vector.</summary>
    public double[] Scores(IReadOnlyList<double> features)
    {
        ArgumentNullException.ThrowIfNull(features);
        var score = (double[])Start.Clone();
        int trees = Feature.Length / Slots;
        for (int t = 0; t < trees; t++)
        {
            int offset = t * Slots, slot = 0;
            while (Feature[offset + slot] >= 0)
                slot = (double)(float)features[Feature[offset + slot]] <= Value[offset + slot] ? 2 * slot + 1 : 2 * slot + 2;
            score[t % Classes] += LearningRate * Value[offset + slot];
        }
        return score;
    }
}
