using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>Everything one plan is computed from: the grid's zones, the incident's states and the suspect.</summary>
internal sealed class PlanningContext
{
    public PlanningContext(NetworkGraph graph, Incident incident, SectionId suspect, RankingResult? ranking, SwitchingOptions options)
    {
        Graph = graph;
        Grid = graph.Grid;
        Incident = incident;
        Ranking = ranking;
        Options = options;
        Zones = new ZoneMap(graph);
        if (!graph.Sections.Contains(suspect) || !Zones.TryZoneOf(suspect, out var zone))
        {
            throw new PlanningException($"section {suspect} is not a section of grid '{Grid.Name}'");
        }

        Suspect = suspect;
        SuspectZone = zone;
        FaultTimeStates = SwitchStates.AtFaultTime(Grid, incident);
        StartStates = SwitchStates.AfterTrip(Grid, incident);
        FaultTimeNetwork = EnergiseOrThrow(FaultTimeStates, "at fault time");
        StartNetwork = EnergiseOrThrow(StartStates, "after the trip");
        SuspectSubstation = Zones.All[zone].Nodes.Select(FaultTimeNetwork.SubstationIndexOf).FirstOrDefault(s => s >= 0, -1);
        var scheme = SuspectSubstation >= 0 ? Grid.Substations[SuspectSubstation].Grounding.Scheme : GroundingScheme.Solid;
        StandingEarthFault = incident.TrippedDevice is null
            && incident.FaultType is null or FaultType.LG
            && scheme is GroundingScheme.Isolated or GroundingScheme.Resonant;
        Affected = [.. Enumerable.Range(0, Grid.Nodes.Length).Select(FaultTimeNetwork.IsEnergised)];
        ProbabilityOfZone = new double[Zones.All.Length];
        if (ranking is not null)
        {
            foreach (var s in ranking.Sections)
            {
                if (Zones.TryZoneOf(s.Id, out var z))
                {
                    ProbabilityOfZone[z] += s.Probability;
                }
            }
        }
    }

    public NetworkGraph Graph { get; }

    public Grid Grid { get; }

    public Incident Incident { get; }

    public RankingResult? Ranking { get; }

    public SwitchingOptions Options { get; }

    public ZoneMap Zones { get; }

    public SectionId Suspect { get; }

    public int SuspectZone { get; }

    /// <summary>Zones isolated besides the suspect's (the second section of a cross-country fault); never re-energised.</summary>
    public HashSet<int> AlsoIsolated { get; } = [];

    /// <summary>True for the suspect's zone and every zone isolated with it.</summary>
    public bool IsIsolated(int zone) => zone == SuspectZone || AlsoIsolated.Contains(zone);

    /// <summary>Substation feeding the suspect at fault time, or -1.</summary>
    public int SuspectSubstation { get; }

    /// <summary>Nothing tripped on an earth fault of an isolated or resonant network: the fault stands.</summary>
    public bool StandingEarthFault { get; }

    public SwitchStates FaultTimeStates { get; }

    public SwitchStates StartStates { get; }

    public EnergisedNetwork FaultTimeNetwork { get; }

    public EnergisedNetwork StartNetwork { get; }

    /// <summary>Per node: supplied at fault time, so its customers count when it loses supply.</summary>
    public ImmutableArray<bool> Affected { get; }

    /// <summary>Per zone: the ranking's probability of its section holding the fault (0 without a ranking).</summary>
    public double[] ProbabilityOfZone { get; }

    /// <summary>The fault current the suspect would drive through a live device on its path.</summary>
    public ThroughCurrent FaultCurrent => StandingEarthFault ? ThroughCurrent.StandingEarthFault : ThroughCurrent.ShortCircuit;

    public EnergisedNetwork? TryEnergise(SwitchStates states) => Graph.TryEnergise(states, out var network, out _) ? network : null;

    public bool ZoneLive(EnergisedNetwork network, int zone) => network.IsEnergised(Zones.All[zone].Nodes[0]);

    /// <summary>The current switch <paramref name="device"/> carries in <paramref name="network"/> if asked to open, for a fault in the suspect zone.</summary>
    public ThroughCurrent CurrentThrough(EnergisedNetwork network, int device)
    {
        var suspectNode = Zones.All[SuspectZone].Nodes[0];
        if (!network.IsEnergised(suspectNode))
        {
            return ThroughCurrent.Load;
        }

        var far = FarNodeOf(network, device);
        return far >= 0 && network.IsAtOrBeyond(far, suspectNode) ? FaultCurrent : ThroughCurrent.Load;
    }

    /// <summary>The end of a closed, live switch away from its source; -1 when it does not feed anything.</summary>
    public int FarNodeOf(EnergisedNetwork network, int device)
    {
        var s = Grid.Switches[device];
        var from = Grid.NodeIndex(s.From);
        var to = Grid.NodeIndex(s.To);
        var edge = new EdgeRef(EdgeKind.Switch, device);
        return network.FeedingEdgeOf(to) == edge ? to : network.FeedingEdgeOf(from) == edge ? from : -1;
    }

    public string Describe(int device) => Grid.Switches[device].Id.Value;

    private EnergisedNetwork EnergiseOrThrow(SwitchStates states, string when) =>
        Graph.TryEnergise(states, out var network, out var problem)
            ? network
            : throw new PlanningException($"the incident's switch states give no radial network {when}: {problem}");
}
