using System.CommandLine;

namespace ItemReduce.Cli;

/// <summary>The options of every command. Plan-file keys are these names without the leading dashes.</summary>
internal sealed class CliOptions
{
    public readonly Option<string?> Responses = new("--responses") { Description = "Responses CSV: one row per respondent, one column per item, plus an id column." };
    public readonly Option<string?> Codebook = new("--codebook") { Description = "Codebook CSV with header item,subscale,reverse,min,max,text." };
    public readonly Option<string?> Plan = new("--plan") { Description = "JSON plan file holding any of these options (command-line options override it)." };
    public readonly Option<string?> Out = new("--out") { Description = "Output folder (default: itemreduce-results). Written only when the whole run succeeds." };
    public readonly Option<bool> Force = new("--force") { Description = "Replace the output folder if it already exists." };
    public readonly Option<string?> Missing = new("--missing") { Description = "Comma-separated missing-data codes, replacing the default list (empty cell, NA), e.g. --missing=-99,99. An empty cell is always missing." };
    public readonly Option<string?> IdColumn = new("--id-column") { Description = "Respondent-id column (default: 'respondent' if present, else the first column that is not an item)." };
    public readonly Option<string?> Delimiter = new("--delimiter") { Description = "Field delimiter: comma, semicolon or tab (default: detected from the header)." };
    public readonly Option<ulong?> Seed = new("--seed") { Description = "Seed for every random step (default 1). Same inputs and seed give identical results." };
    public readonly Option<bool> Quiet = new("--quiet") { Description = "No progress messages." };
    public readonly Option<bool> Progress = new("--progress") { Description = "Progress messages on stderr even when stderr is not a terminal." };
    public readonly Option<bool> Verbose = new("--verbose") { Description = "Show full details of unexpected internal errors." };

    // Screening
    public readonly Option<double?> CutoffP = new("--cutoff-p") { Description = "Upper-tail probability of the chi-square cutoff for squared distances, df = items answered (default 0.001)." };
    public readonly Option<string?> Distance = new("--distance") { Description = "Distance that raises the atypical flag: robust (ER estimate for incomplete data, default) or classical." };
    public readonly Option<double?> RunShare = new("--run-share") { Description = "Flag a run of identical consecutive answers covering at least this share of the items (default 0.5; the run must also be at least 8 items long)." };
    public readonly Option<double?> FlatSd = new("--flat-sd") { Description = "Flag respondents whose own answers have a standard deviation below this value (default 0.2)." };
    public readonly Option<double?> MissingLimit = new("--missing-limit") { Description = "Flag respondents who left more than this share of items unanswered (default 0.5)." };
    public readonly Option<bool> KeepFlagged = new("--keep-flagged") { Description = "Keep flagged respondents in the later stages of 'run' (default: set aside)." };

    // Dimensions
    public readonly Option<string?> Correlation = new("--correlation") { Description = "pearson (default) or polychoric." };
    public readonly Option<string?> MissingData = new("--missing-data") { Description = "pairwise (default: each pair uses everyone who answered both) or listwise." };
    public readonly Option<int?> Replicates = new("--replicates") { Description = "Parallel-analysis replicates (default 1000)." };
    public readonly Option<double?> Percentile = new("--percentile") { Description = "Percentile of the random eigenvalues used as threshold (default 95)." };
    public readonly Option<string?> Reference = new("--reference") { Description = "Parallel-analysis reference: normal (default; Wishart draws) or permutation (shuffled columns)." };
    public readonly Option<string?> FactorsRule = new("--factors-rule") { Description = "Rule that sets the number of factors: parallel (default), map or kaiser." };
    public readonly Option<int?> Factors = new("--factors") { Description = "Fix the number of factors instead of using a rule." };
    public readonly Option<int?> Threads = new("--threads") { Description = "Worker threads for parallel analysis (default: all cores). Results do not depend on it." };

    // Factoring and short form
    public readonly Option<string?> Extraction = new("--extraction") { Description = "minres (default), paf or ml." };
    public readonly Option<string?> Rotation = new("--rotation") { Description = "oblimin (default), promax, varimax or none." };
    public readonly Option<int?> ItemsPerFactor = new("--items-per-factor") { Description = "Items per scale in the short form (default 4)." };
    public readonly Option<string?> ScaleTargets = new("--scale-targets") { Description = "Per-subscale short-form lengths, e.g. comfort=3,crew=5 (others use --items-per-factor)." };
    public readonly Option<double?> Holdout = new("--holdout") { Description = "Share of respondents held out to evaluate the short form on data it was not chosen on (default 0: none; e.g. 0.5)." };

    // Appendix
    public readonly Option<bool> NoPdf = new("--no-pdf") { Description = "Do not draw appendix.pdf (tables.md and tables.tex are still written)." };

    public IEnumerable<Option> ScreeningOptions => [CutoffP, Distance, RunShare, FlatSd, MissingLimit];
    public IEnumerable<Option> DimensionOptions => [Correlation, MissingData, Replicates, Percentile, Reference, FactorsRule, Factors, Threads];
    public IEnumerable<Option> ShortFormOptions => [Extraction, Rotation, ItemsPerFactor, ScaleTargets, Holdout];

    /// <summary>Every option of every command (plan files may hold any of them).</summary>
    public IEnumerable<Option> All => Common.Concat(Writing).Concat(ScreeningOptions).Concat(DimensionOptions).Concat(ShortFormOptions).Append(KeepFlagged).Append(NoPdf);

    /// <summary>Options every command has.</summary>
    public IEnumerable<Option> Common => [Responses, Codebook, Plan, Missing, IdColumn, Delimiter, Seed, Quiet, Progress, Verbose];

    /// <summary>Options of commands that write results.</summary>
    public IEnumerable<Option> Writing => [Out, Force];

    /// <summary>Plan-file key of an option.</summary>
    public static string Key(Option o) => o.Name.TrimStart('-');
}
