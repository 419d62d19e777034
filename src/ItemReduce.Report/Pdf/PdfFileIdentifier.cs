namespace ItemReduce.Report.Pdf;

/// <summary>Placeholder: replaced once the backend's file identifier behaviour is known.</summary>
internal static class PdfFileIdentifier
{
    public static void MakeDeterministic(byte[] pdf) { _ = pdf; }
}
