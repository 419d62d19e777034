using System.Text.RegularExpressions;
using ItemReduce.Application.Jobs;
using ItemReduce.Application.Settings;
using ItemReduce.Core;

namespace ItemReduce.Tests.Application;

/// <summary>A warning created in Core may name the option-record property that acts on it; the edge words it as the
/// command-line option. These tests tie the two ends together.</summary>
public class WarningSettingsTests
{
    private static string FindRoot()
    {
        string root = AppContext.BaseDirectory;
        while (!File.Exists(Path.Combine(root, "ItemReduce.sln"))) root = Path.GetDirectoryName(root)!;
        return root;
    }

    [Fact]
    public void Every_mapped_setting_is_a_declared_option()
    {
        var names = SettingsCatalog.All.Select(s => s.Name).ToHashSet(StringComparer.Ordinal);
        foreach (var (property, option) in WarningSettings.ByProperty)
            Assert.True(names.Contains(option), $"{property} maps to '{option}', which the settings catalogue does not declare");
    }

    [Fact]
    public void Every_property_a_Core_warning_names_is_mapped()
    {
        // The fourth argument of `new AnalysisWarning(...)` in Core is written as nameof(Type.Property).
        string core = Path.Combine(FindRoot(), "src", "ItemReduce.Core");
        var named = Directory.EnumerateFiles(core, "*.cs", SearchOption.AllDirectories)
            .SelectMany(f => Regex.Matches(File.ReadAllText(f), @"new AnalysisWarning\((?:[^;]*?),\s*nameof\(([\w.]+)\)\)\)?;")
                .Select(m => m.Groups[1].Value.Split('.')[^1]))
            .Distinct().ToList();
        Assert.NotEmpty(named);
        foreach (var property in named)
            Assert.True(WarningSettings.ByProperty.ContainsKey(property), $"Core names {property} in a warning; map it in WarningSettings");
    }

    [Fact]
    public void A_warning_that_names_a_setting_ends_with_its_option_and_others_do_not()
    {
        var named = new AnalysisWarning("self-check-skipped", "self-check", "The self-check was skipped.", "Surveys");
        var plain = new AnalysisWarning("kmo-low", "dimensions", "Sampling adequacy is low.");
        Assert.EndsWith("The self-check was skipped. (option --self-check)", WarningLines.Format(named, 1, 2));
        Assert.EndsWith("Sampling adequacy is low.", WarningLines.Format(plain, 2, 2));
        Assert.Null(WarningSettings.OptionFor(new AnalysisWarning("x", "data", "Unknown property.", "NoSuchProperty")));
    }
}
