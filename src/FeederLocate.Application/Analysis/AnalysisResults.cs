using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;

namespace FeederLocate.Application.Analysis;

/// <summary>A ranking, or why there is none.</summary>
public sealed record RankingAttempt(RankingResult? Result, string? Problem);

/// <summary>A switching order, or why there is none.</summary>
public sealed record PlanAttempt(SwitchingPlan? Plan, string? Problem);

/// <summary>A return to normal after the repair, or why there is none.</summary>
public sealed record ReturnAttempt(ReturnPlan? Plan, string? Problem);

/// <summary>An incident's ranking and the switching order for its most likely section.</summary>
public sealed record IncidentAnalysisResult(RankingAttempt Ranking, PlanAttempt Plan);
