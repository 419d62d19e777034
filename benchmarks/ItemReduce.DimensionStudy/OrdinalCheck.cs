namespace ItemReduce.DimensionStudy;

/// <summary>Placeholder, filled in below.</summary>
internal static class OrdinalCheck
{
    public static void Run(string outDir, int sets, int replicates, ulong seed) => throw new NotImplementedException();
}
