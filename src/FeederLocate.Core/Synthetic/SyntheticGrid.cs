using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Synthetic;

/// <summary>
/// Generates large radial MV grids: substations with feeders that branch at random, sectionalising
/// switches, normally-open ties between feeders, indicators and loads. Deterministic for a seed.
/// </summary>
public static class SyntheticGrid
{
    private static readonly LineType Cable = new(new LineTypeId("CAB-AL240"), Construction.Cable, 0.125, 0.11, 0.45, 0.36, 304, 420,
        DataSource: "r1: IEC 60228 class 2 Al 240 mm² at 20 °C; c0: cable handbook table (Heuck 2013); other values common practice");

    private static readonly LineType Overhead = new(new LineTypeId("OHL-AL95"), Construction.Overhead, 0.306, 0.35, 0.454, 1.618, 5, 300,
        DataSource: "typical 20 kV overhead line values (from memory)");

    public static Grid Generate(SyntheticGridOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        var random = new Random(options.Seed);
        var substations = new List<Substation>();
        var nodes = new List<Node>();
        var segments = new List<Segment>();
        var switches = new List<SwitchingDevice>();
        var indicators = new List<Indicator>();
        var feeders = new List<List<NodeId>>();
        var feederCount = Math.Max(options.Substations, (int)Math.Ceiling(options.Segments / (double)options.SegmentsPerFeeder));

        for (var s = 0; s < options.Substations; s++)
        {
            var bus = new NodeId($"SS{s + 1}-BUS");
            nodes.Add(new Node(bus, X: s * 100.0, Y: 0));
            substations.Add(new Substation(
                new SubstationId($"SS{s + 1}"), bus, 20, new BusbarShortCircuit(250 + (50 * s), 0.1),
                new ImpedanceOhm(0.3, 2.5), 40, Grounding(options.Scheme)));
        }

        var segmentNumber = 0;
        for (var f = 0; f < feederCount; f++)
        {
            var substation = substations[f % substations.Count];
            var head = new NodeId($"F{f + 1}-0");
            nodes.Add(new Node(head));
            switches.Add(new SwitchingDevice(new SwitchId($"CB-F{f + 1}"), substation.BusNode, head, SwitchKind.Breaker, false, true));
            var feederNodes = new List<NodeId> { head };
            feeders.Add(feederNodes);
            var quota = (options.Segments / feederCount) + (f < options.Segments % feederCount ? 1 : 0);
            for (var k = 0; k < quota; k++)
            {
                // Mostly extend the newest part (a trunk), sometimes branch from anywhere (laterals).
                var attach = random.NextDouble() < 1 - options.LateralShare
                    ? feederNodes[Math.Max(0, feederNodes.Count - 1 - random.Next(3))]
                    : feederNodes[random.Next(feederNodes.Count)];
                if (k > 0 && random.Next(options.SegmentsPerSwitch) == 0)
                {
                    var beyond = new NodeId($"F{f + 1}-{feederNodes.Count}");
                    nodes.Add(new Node(beyond));
                    var kind = Kind(random, options);
                    var remote = kind == SwitchKind.LoadBreakSwitch && random.Next(2) == 0;
                    switches.Add(new SwitchingDevice(new SwitchId($"SW-F{f + 1}-{switches.Count}"), attach, beyond, kind, false, remote,
                        remote ? null : TimeSpan.FromMinutes(10 + random.Next(50))));
                    feederNodes.Add(beyond);
                    attach = beyond;
                }

                var to = new NodeId($"F{f + 1}-{feederNodes.Count}");
                var load = 20 + random.Next(380);
                nodes.Add(new Node(to, load * options.LoadScale, Customers: 1 + (load / 8)));
                var cable = k < quota / 3 || random.Next(3) == 0;
                var id = new SegmentId($"S{++segmentNumber}");
                segments.Add(new Segment(id, attach, to, cable ? Cable.Id : Overhead.Id, Math.Round(0.2 + (random.NextDouble() * (cable ? 1.2 : 3.0)), 3)));
                if (random.NextDouble() < options.IndicatorsPerSegment)
                {
                    var directional = random.Next(3) == 0;
                    indicators.Add(new Indicator(new IndicatorId($"FPI-{id}"), id, attach, 400, directional ? 3 : 10, directional, random.Next(4) != 0));
                }

                feederNodes.Add(to);
            }
        }

        // Ties between the ends of neighbouring feeders, normally open, so the normal state stays radial.
        for (var f = 0; f + 1 < feeders.Count; f++)
        {
            var a = feeders[f][^1];
            var b = feeders[f + 1][^1];
            switches.Add(new SwitchingDevice(new SwitchId($"NO-F{f + 1}-F{f + 2}"), a, b, SwitchKind.LoadBreakSwitch, true, true));
        }

        AddExtraTies(random, options, feeders, switches);
        var grid = Grid.Create($"Synthetic {options.Segments} segments (seed {options.Seed})", 50, [Cable, Overhead], substations, nodes, segments, switches, indicators);
        return options.CrewBases > 0 ? grid.WithCrewBases(Crews(options, substations, switches)) : grid;
    }

    /// <summary>The crew bases, from a random stream of their own: each at a substation's bus in turn, with its own time to about half the manual devices.</summary>
    private static IEnumerable<CrewBase> Crews(SyntheticGridOptions options, List<Substation> substations, List<SwitchingDevice> switches)
    {
        var random = new Random(unchecked((options.Seed * 7919) + 17));
        for (var b = 0; b < options.CrewBases; b++)
        {
            var times = ImmutableDictionary.CreateBuilder<SwitchId, TimeSpan>();
            foreach (var device in switches.Where(s => !s.Remote))
            {
                if (random.Next(2) == 0)
                {
                    times[device.Id] = TimeSpan.FromMinutes(5 + random.Next(60));
                }
            }

            yield return new CrewBase(new CrewBaseId($"BASE{b + 1}"), substations[b % substations.Count].BusNode, options.CrewsPerBase, null, times.ToImmutable());
        }
    }

    /// <summary>Disconnector, fuse or load-break switch by the options' shares (the default shares draw as one in six each).</summary>
    private static SwitchKind Kind(Random random, SyntheticGridOptions options)
    {
        if (options.DisconnectorShare == SyntheticGridOptions.DefaultKindShare && options.FuseShare == SyntheticGridOptions.DefaultKindShare)
        {
            return random.Next(6) switch { 0 => SwitchKind.Disconnector, 1 => SwitchKind.Fuse, _ => SwitchKind.LoadBreakSwitch };
        }

        var roll = random.NextDouble();
        return roll < options.DisconnectorShare ? SwitchKind.Disconnector
            : roll < options.DisconnectorShare + options.FuseShare ? SwitchKind.Fuse
            : SwitchKind.LoadBreakSwitch;
    }

    /// <summary>Normally-open load-break ties from a node of each feeder (not its head) to a node of another feeder.</summary>
    private static void AddExtraTies(Random random, SyntheticGridOptions options, List<List<NodeId>> feeders, List<SwitchingDevice> switches)
    {
        for (var f = 0; f < feeders.Count; f++)
        {
            var others = Enumerable.Range(0, feeders.Count)
                .Where(g => g != f && (!options.ExtraTiesBetweenSubstations || g % options.Substations != f % options.Substations))
                .ToList();
            for (var t = 0; t < options.ExtraTiesPerFeeder && others.Count > 0 && feeders[f].Count > 1; t++)
            {
                var g = others[random.Next(others.Count)];
                if (feeders[g].Count < 2)
                {
                    continue;
                }

                var a = feeders[f][1 + random.Next(feeders[f].Count - 1)];
                var b = feeders[g][1 + random.Next(feeders[g].Count - 1)];
                var remote = random.Next(2) == 0;
                switches.Add(new SwitchingDevice(new SwitchId($"NO-F{f + 1}-{t + 1}"), a, b, SwitchKind.LoadBreakSwitch, true, remote,
                    remote ? null : TimeSpan.FromMinutes(10 + random.Next(50))));
            }
        }
    }

    private static Grounding Grounding(GroundingScheme scheme) => scheme switch
    {
        GroundingScheme.Resonant => new Grounding(scheme, DetuningPercent: 5, DampingPercent: 3),
        GroundingScheme.Impedance => new Grounding(scheme, NeutralResistanceOhm: 12),
        _ => new Grounding(scheme),
    };
}
