using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;

namespace FeederLocate.Application.Analysis;

/// <summary>A ranking, or why there is none.</summary>
public sealed record RankingOutcome(RankingResult? Result, string? Problem);

/// <summary>A switching order, or why there is none.</summary>
public sealed record PlanOutcome(SwitchingPlan? Plan, string? Problem);

/// <summary>An incident's ranking and the switching order for its most likely section.</summary>
public sealed record IncidentAnalysisResult(RankingOutcome Ranking, PlanOutcome Plan);
