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

    /// <summary>Options every command has.</summary>
    public IEnumerable<Option> Common => [Responses, Codebook, Plan, Missing, IdColumn, Delimiter, Seed, Quiet, Progress, Verbose];

    /// <summary>Options of commands that write results.</summary>
    public IEnumerable<Option> Writing => [Out, Force];

    /// <summary>Plan-file key of an option.</summary>
    public static string Key(Option o) => o.Name.TrimStart('-');
}
