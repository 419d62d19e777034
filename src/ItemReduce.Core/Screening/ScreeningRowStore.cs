using System.Collections;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Column-wise storage of the per-respondent screening outcome (about 60 bytes per respondent instead of a record,
/// a list of reasons and their headers). <see cref="RespondentScreeningRow"/> objects are created on access; reason
/// lists are shared immutable lists, one per combination of reasons (bit k = <see cref="ScreeningReasons.All"/>[k]).
/// </summary>
internal sealed class ScreeningRowStore : IReadOnlyList<RespondentScreeningRow>
{
    private static readonly IReadOnlyList<string>[] ReasonLists = BuildReasonLists();

    private readonly IReadOnlyList<string> _ids;
    private readonly int _items;
    private readonly int[] _answered;
    private readonly double[] _d2;
    private readonly double[] _robustD2;
    private readonly double[] _cutoffByDf;

    /// <param name="ids">Respondent ids (shared, not copied).</param>
    /// <param name="items">p, for the missing share.</param>
    /// <param name="answered">Items answered per respondent.</param>
    /// <param name="d2">Classical D² per respondent.</param>
    /// <param name="robustD2">Robust D² per respondent.</param>
    /// <param name="cutoffByDf">χ² cutoff by df = items answered (index 0 = NaN).</param>
    public ScreeningRowStore(IReadOnlyList<string> ids, int items, int[] answered, double[] d2, double[] robustD2, double[] cutoffByDf)
    {
        int n = ids.Count;
        _ids = ids;
        _items = items;
        _answered = answered;
        _d2 = d2;
        _robustD2 = robustD2;
        _cutoffByDf = cutoffByDf;
        PValue = new double[n];
        RobustPValue = new double[n];
        LongString = new int[n];
        Irv = new double[n];
        EvenOdd = new double[n];
        ReasonMask = new byte[n];
        AlternatingRun = new int[n];
        PersonTotal = new double[n];
        Synonyms = new double[n];
        Antonyms = new double[n];
        RandomAnswering = new double[n];
    }

    public double[] PValue { get; }
    public double[] RobustPValue { get; }
    public int[] LongString { get; }
    public double[] Irv { get; }
    public double[] EvenOdd { get; }
    public int[] AlternatingRun { get; }
    public double[] PersonTotal { get; }
    public double[] Synonyms { get; }
    public double[] Antonyms { get; }
    public double[] RandomAnswering { get; }

    /// <summary>Bit k set when reason <see cref="ScreeningReasons.All"/>[k] applies.</summary>
    public byte[] ReasonMask { get; }

    /// <summary>Bit of a reason code in <see cref="ReasonMask"/>.</summary>
    public static byte Bit(string code)
    {
        int k = ScreeningReasons.All.ToList().IndexOf(code);
        if (k < 0) throw new ArgumentException($"Unknown reason code '{code}'.", nameof(code));
        return (byte)(1 << k);
    }

    public int Count => _ids.Count;

    public RespondentScreeningRow this[int index]
    {
        get
        {
            int a = _answered[index];
            int mask = ReasonMask[index];
            return new RespondentScreeningRow(_ids[index], a, _d2[index], _robustD2[index], _cutoffByDf[a], PValue[index],
                RobustPValue[index], LongString[index], Irv[index], EvenOdd[index], (_items - a) / (double)_items,
                mask != 0, ReasonLists[mask], AlternatingRun[index], PersonTotal[index], Synonyms[index], Antonyms[index], RandomAnswering[index]);
        }
    }

    /// <summary>See <see cref="ScreeningResult.RespondentsToAnalyse"/>.</summary>
    public List<int> RespondentsToAnalyse(bool keepFlagged)
    {
        var keep = new List<int>(_answered.Length);
        for (int i = 0; i < _answered.Length; i++)
            if (_answered[i] > 0 && (keepFlagged || ReasonMask[i] == 0)) keep.Add(i);
        return keep;
    }

    /// <summary>Finite robust or classical D² of the respondents who answered exactly <paramref name="items"/> items, in input order.</summary>
    public double[] DistancesOfRespondentsAnswering(bool robust, int items)
    {
        var source = robust ? _robustD2 : _d2;
        var list = new List<double>();
        for (int i = 0; i < source.Length; i++)
            if (_answered[i] == items && double.IsFinite(source[i])) list.Add(source[i]);
        return list.ToArray();
    }

    /// <summary>Respondents carrying the reason with bit <paramref name="bit"/>.</summary>
    public int CountWith(byte bit)
    {
        int c = 0;
        foreach (byte m in ReasonMask) if ((m & bit) != 0) c++;
        return c;
    }

    /// <summary>Respondents with at least one reason.</summary>
    public int Flagged()
    {
        int c = 0;
        foreach (byte m in ReasonMask) if (m != 0) c++;
        return c;
    }

    public IEnumerator<RespondentScreeningRow> GetEnumerator()
    {
        for (int i = 0; i < Count; i++) yield return this[i];
    }

    IEnumerator IEnumerable.GetEnumerator() => GetEnumerator();

    private static IReadOnlyList<string>[] BuildReasonLists()
    {
        var all = ScreeningReasons.All;
        var lists = new IReadOnlyList<string>[1 << all.Count];
        for (int m = 0; m < lists.Length; m++)
            lists[m] = Enumerable.Range(0, all.Count).Where(k => (m & (1 << k)) != 0).Select(k => all[k]).ToList().AsReadOnly();
        return lists;
    }
}
