using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>A section the ranking gives a share of the probability, with its zone.</summary>
internal sealed record Suspect(int Zone, SectionId Section, double Probability);
