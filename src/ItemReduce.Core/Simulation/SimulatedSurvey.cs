using ItemReduce.Core.Data;

namespace ItemReduce.Simulation;

/// <summary>Simulated responses with the truth that generated them.</summary>
/// <param name="Responses">Raw responses (reverse-keyed items mirrored, missing = NaN).</param>
/// <param name="Codebook">A codebook describing the items (subscale = "F1".. or the names given).</param>
/// <param name="Spec">The generating model.</param>
/// <param name="Careless">Planted careless kind of each respondent.</param>
public sealed record SimulatedSurvey(ResponseMatrix Responses, Codebook Codebook, FactorModelSpec Spec, CarelessKind[] Careless);
