using ItemReduce.Report.Layout;

namespace ItemReduce.Tests.Report;

public class ColumnWidthsTests
{
    [Fact]
    public void Natural_widths_are_kept_when_they_fit()
        => Assert.Equal([30f, 50f, 20f], ColumnWidths.Fit([30f, 50f, 20f], 200f));

    [Fact]
    public void Narrow_columns_keep_their_width_and_wide_ones_share_the_rest_in_proportion()
    {
        // Available 300, equal share 100: columns of 40 and 60 keep their widths; the 400 and 200 columns
        // share 300 - 100 = 200 in ratio 2:1 (worked by hand).
        float[] w = ColumnWidths.Fit([40f, 400f, 60f, 200f], 300f);
        Assert.Equal(40f, w[0]);
        Assert.Equal(60f, w[2]);
        Assert.Equal(200f * 2f / 3f, w[1], 3);
        Assert.Equal(200f / 3f, w[3], 3);
    }

    [Theory]
    [InlineData(new float[] { 500f, 500f }, 300f)]
    [InlineData(new float[] { 10f, 10f, 10f, 900f }, 120f)]
    [InlineData(new float[] { 35f, 36f, 37f }, 100f)]
    public void Result_never_exceeds_the_available_width_and_never_widens_a_column(float[] natural, float available)
    {
        float[] w = ColumnWidths.Fit(natural, available);
        Assert.True(w.Sum() <= available + 0.01f);
        for (int i = 0; i < w.Length; i++) Assert.True(w[i] <= natural[i] + 0.001f && w[i] > 0);
    }
}
