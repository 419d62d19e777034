namespace ItemReduce.Core.ShortForm;

/// <summary>Whether an item is in the short form.</summary>
public enum ItemDecision
{
    /// <summary>In the short form.</summary>
    Keep,
    /// <summary>Not in the short form; <see cref="ItemJudgement.Reasons"/> says why.</summary>
    Drop,
}
