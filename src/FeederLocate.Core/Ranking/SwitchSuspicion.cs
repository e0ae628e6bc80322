using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// A switch whose other position than recorded explains the evidence: its posterior probability, and
/// where the fault most probably lies if it is so.
/// </summary>
/// <param name="State">The position the evidence suggests (the other one than recorded).</param>
/// <param name="Section">The most probable section were the switch in <paramref name="State"/>.</param>
/// <param name="SectionProbability">That section's probability under that hypothesis.</param>
public sealed record SwitchSuspect(SwitchId Device, SwitchPosition State, double Probability, SectionId Section, double SectionProbability);

/// <summary>
/// Hypotheses "switch X is in the other position than recorded", one switch at a time, tried only for the
/// switches that could explain the evidence: closings of open switches (ties first) whose far side is dead
/// in the recorded positions yet holds an indicator that picked up. A dead indicator cannot see fault
/// current; a back-fed one can. An unrecorded opening is not tried: the part beyond it carries no fault
/// current either way, so what its indicators show barely tells the two apart (on generated grids of every
/// scheme an earth fault before an unrecorded open switch gave evidence the recorded positions explained).
/// A toggle that gives no radial network (it would parallel two sources or close a loop) is not tried.
/// Each hypothesis is scored by its marginal evidence: the ranking's likelihood summed over every fault
/// hypothesis, with the segments' fault-rate prior normalised over what is energised in that topology.
/// Its prior odds are p / (1 − p) against the recorded positions (<see cref="RankingOptions.WrongSwitchPositionPrior"/>).
/// The reported segment and section probabilities stay those of the recorded positions (see
/// <see cref="FaultRanking"/>); the suspects are reported beside them.
/// </summary>
internal static class SwitchSuspicion
{
    /// <summary>A switch's other position is reported from this posterior probability on (FORMATS.md: 5 %).</summary>
    public const double ReportedFrom = 0.05;

    public static ImmutableArray<SwitchSuspect> Find(RankingComputation recorded, List<SegmentScore> scores)
    {
        var options = recorded.Options;
        if (options.WrongSwitchPositionPrior <= 0 || options.SwitchSuspectCandidates == 0)
        {
            return [];
        }

        var candidates = Candidates(recorded).Take(options.SwitchSuspectCandidates).ToList();
        if (candidates.Count == 0)
        {
            return [];
        }

        var grid = recorded.Graph.Grid;
        var logOdds = Math.Log(options.WrongSwitchPositionPrior / (1 - options.WrongSwitchPositionPrior));
        var hypotheses = new List<(int Switch, SwitchPosition State, double Log, SectionId Section, double SectionProbability)>();
        var recordedLog = LogEvidence(scores);
        foreach (var (device, state) in candidates)
        {
            var incident = recorded.Incident with { SwitchStates = recorded.Incident.SwitchStates.SetItem(grid.Switches[device].Id, state) };
            if (!recorded.Graph.TryEnergise(SwitchStates.AtFaultTime(grid, incident), out _, out _))
            {
                continue;
            }

            List<SegmentScore> toggled;
            RankingComputation computation;
            try
            {
                computation = new RankingComputation(recorded.Graph, incident, options, recorded.Priors) { Exhaustive = recorded.Exhaustive };
                toggled = computation.RefineContenders(computation.ScoreSegments());
            }
            catch (RankingException)
            {
                continue;
            }

            var (section, probability) = TopSection(computation, toggled);
            hypotheses.Add((device, state, logOdds + LogEvidence(toggled), section, probability));
        }

        var posterior = LogMath.Normalise([recordedLog, .. hypotheses.Select(h => h.Log)]);
        return [.. hypotheses.Select((h, k) => new SwitchSuspect(grid.Switches[h.Switch].Id, h.State, posterior[k + 1], h.Section, h.SectionProbability))
            .Where(s => s.Probability >= ReportedFrom)
            .OrderByDescending(s => s.Probability).ThenBy(s => s.Device.Value, StringComparer.Ordinal)];
    }

    /// <summary>log P(evidence | topology): Σ prior·likelihood over the energised segments, the prior normalised over them.</summary>
    private static double LogEvidence(List<SegmentScore> scores)
    {
        var joint = double.NegativeInfinity;
        var prior = double.NegativeInfinity;
        foreach (var s in scores)
        {
            joint = LogMath.Add(joint, s.LogPosterior);
            prior = LogMath.Add(prior, s.LogPrior);
        }

        return joint - prior;
    }

    private static (SectionId Section, double Probability) TopSection(RankingComputation computation, List<SegmentScore> scores)
    {
        var p = LogMath.Normalise([.. scores.Select(s => s.LogPosterior)]);
        var bySection = new Dictionary<SectionId, double>();
        for (var k = 0; k < scores.Count; k++)
        {
            var id = computation.Graph.Sections.OfSegment(scores[k].Segment).Id;
            bySection[id] = bySection.GetValueOrDefault(id) + p[k];
        }

        var top = bySection.OrderByDescending(x => x.Value).ThenBy(x => x.Key.Value, StringComparer.Ordinal).First();
        return (top.Key, top.Value);
    }

    /// <summary>The switches to try in their other position, most promising first.</summary>
    private static IEnumerable<(int Switch, SwitchPosition State)> Candidates(RankingComputation recorded)
    {
        var graph = recorded.Graph;
        var grid = graph.Grid;
        var network = recorded.Network;
        var states = network.States;

        // Dead islands of the recorded positions, and how many of their indicators picked up.
        var island = DeadIslands(graph, network);
        var pickedUp = new Dictionary<int, int>();
        foreach (var o in recorded.Observed)
        {
            if (o.Indication.State is not (IndicatorState.None or IndicatorState.Unknown)
                && island[grid.NodeIndex(o.Indicator.Node)] is var k and >= 0)
            {
                pickedUp[k] = pickedUp.GetValueOrDefault(k) + 1;
            }
        }

        if (pickedUp.Count == 0)
        {
            yield break;
        }

        var closings = new List<(int Switch, int Count, bool Tie)>();
        for (var d = 0; d < grid.Switches.Length; d++)
        {
            if (states.IsClosed(d))
            {
                continue;
            }

            var (from, to) = graph.EndsOf(new EdgeRef(EdgeKind.Switch, d));
            var dead = network.IsEnergised(from) == network.IsEnergised(to) ? -1 : network.IsEnergised(from) ? to : from;
            if (dead >= 0 && pickedUp.GetValueOrDefault(island[dead]) is var count and > 0)
            {
                closings.Add((d, count, grid.Switches[d].NormallyOpen));
            }
        }

        foreach (var c in closings.OrderByDescending(c => c.Count).ThenByDescending(c => c.Tie).ThenBy(c => c.Switch))
        {
            yield return (c.Switch, SwitchPosition.Closed);
        }
    }

    /// <summary>Per node, the index of the dead island (connected through segments and closed switches) it lies in; −1 when energised.</summary>
    private static int[] DeadIslands(NetworkGraph graph, EnergisedNetwork network)
    {
        var island = new int[graph.NodeCount];
        Array.Fill(island, -1);
        var next = 0;
        var stack = new Stack<int>();
        for (var start = 0; start < island.Length; start++)
        {
            if (island[start] >= 0 || network.IsEnergised(start))
            {
                continue;
            }

            island[start] = next;
            stack.Push(start);
            while (stack.Count > 0)
            {
                var v = stack.Pop();
                foreach (var (edge, neighbour) in graph.EdgesAt(v))
                {
                    if (island[neighbour] < 0 && !network.IsEnergised(neighbour)
                        && (edge.Kind == EdgeKind.Segment || network.States.IsClosed(edge.Index)))
                    {
                        island[neighbour] = next;
                        stack.Push(neighbour);
                    }
                }
            }

            next++;
        }

        return island;
    }
}
