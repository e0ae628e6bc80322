using System.Diagnostics.CodeAnalysis;
using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Entry point of the switching planner: from an incident and its ranking, the order an operator would
/// carry out — isolate the suspect section with the nearest suitable devices, reclose the feeder head,
/// restore the rest through normally-open ties within their capacity and voltage (radial load flow with
/// cold-load pickup), in the order of least customer minutes (IEEE 1366 CMI), then the crew's safety
/// steps — plus the test order where the ranking is split or a standing earth fault must be found.
/// Pure computation: no I/O, no clock.
/// </summary>
public static class SwitchingPlanner
{
    /// <summary>
    /// Plans for the ranking's most likely section; for a transient fault (a reclosure held, and no fuse
    /// found blown) the plan switches nothing and is the patrol of the suspects and the field checks.
    /// Throws <see cref="PlanningException"/> where no plan can be made.
    /// </summary>
    public static SwitchingPlan Plan(NetworkGraph graph, Incident incident, RankingResult ranking, SwitchingOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(ranking);
        if (ranking.Sections.IsDefaultOrEmpty)
        {
            throw new PlanningException("the ranking names no section: nothing to isolate");
        }

        if (incident?.Reclosing is { Transient: true } reclosing && !incident.Fuses.Values.Contains(Evidence.FuseCondition.Blown))
        {
            ArgumentNullException.ThrowIfNull(graph);
            options ??= SwitchingOptions.Default;
            options.Validate();
            return TransientFaultPlan.Build(new PlanningContext(graph, incident, ranking.Sections[0].Id, ranking, options), reclosing);
        }

        ArgumentNullException.ThrowIfNull(graph);
        if (CrossCountryPair(graph, ranking) is { } pair)
        {
            return Plan(graph, incident!, pair.First, ranking, options, pair.Second);
        }

        return Plan(graph, incident!, ranking.Sections[0].Id, ranking, options);
    }

    /// <summary>
    /// The sections of the ranking's top cross-country pair when pairs are its best explanation (together more
    /// probable than any single fault) and the two lie in different sections; null otherwise.
    /// </summary>
    private static (SectionId First, SectionId Second, double Probability)? CrossCountryPair(NetworkGraph graph, RankingResult ranking)
    {
        if (ranking.CrossCountry.IsDefaultOrEmpty || ranking.CrossCountry.Sum(p => p.Probability) <= 0.5)
        {
            return null;
        }

        var top = ranking.CrossCountry.MaxBy(p => p.Probability)!;
        var a = graph.Sections.OfSegment(graph.Grid.SegmentIndex(top.First)).Id;
        var b = graph.Sections.OfSegment(graph.Grid.SegmentIndex(top.Second)).Id;
        return a == b ? null : (a, b, top.Probability);
    }

    /// <summary>
    /// Plans assuming the fault lies in <paramref name="isolate"/>. With a <paramref name="ranking"/>, a
    /// test order is added where it is split or the fault is a standing earth fault.
    /// </summary>
    /// <param name="alsoIsolate">A second section isolated with the first (the other fault of a cross-country pair); never re-energised.</param>
    public static SwitchingPlan Plan(NetworkGraph graph, Incident incident, SectionId isolate, RankingResult? ranking = null, SwitchingOptions? options = null, SectionId? alsoIsolate = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        options ??= SwitchingOptions.Default;
        options.Validate();
        if (options.ColdLoadFactor is { } fixedFactor)
        {
            return PlanAt(graph, incident, isolate, ranking, options, alsoIsolate) with
            {
                ColdLoadBasis = $"cold-load factor {Words.Number(fixedFactor)} as set, whatever the outage's duration",
            };
        }

        // The outage runs from the fault to each restoring step: the factor is read from the curve at the plan's last
        // switching step (every customer picked up gets it, which is on the safe side), planned again once if that
        // moment asks for more than the start did.
        var sinceFault = incident.FaultAt is { } f && f < incident.ReportedAt ? incident.ReportedAt - f : TimeSpan.Zero;
        var factor = options.ColdLoadAt(sinceFault);
        var plan = PlanAt(graph, incident, isolate, ranking, options with { ColdLoadFactor = factor }, alsoIsolate);
        var outage = sinceFault + LastSwitching(plan);
        if (options.ColdLoadAt(outage) > factor + 1e-9)
        {
            factor = options.ColdLoadAt(outage);
            plan = PlanAt(graph, incident, isolate, ranking, options with { ColdLoadFactor = factor }, alsoIsolate);
        }

        var curve = Words.List(options.ColdLoadCurve.Select(p => $"{Words.Number(p.Outage.TotalMinutes)} min → {Words.Number(p.Factor)}"));
        return plan with
        {
            ColdLoadBasis = $"cold-load factor {Words.Number(factor)} from the curve ({curve}; linear between points) at an outage of {Words.Number(Math.Round(outage.TotalMinutes))} min, from the fault{(incident.FaultAt is null ? " (reportedAt, no faultAt given)" : string.Empty)} to the last switching step",
            ColdLoadCurve = options.ColdLoadCurve,
        };
    }

    private static TimeSpan LastSwitching(SwitchingPlan plan) =>
        plan.Steps.Where(s => s.ChangesNetwork).Select(s => s.At).DefaultIfEmpty(TimeSpan.Zero).Max();

    private static SwitchingPlan PlanAt(NetworkGraph graph, Incident incident, SectionId isolate, RankingResult? ranking, SwitchingOptions options, SectionId? alsoIsolate)
    {
        var ctx = new PlanningContext(graph, incident, isolate, ranking, options);
        var notes = new List<string>();

        var isolation = Isolation.Plan(ctx);
        IsolationResult? second = null;
        if (alsoIsolate is { } other && other != isolate)
        {
            if (!graph.Sections.Contains(other) || !ctx.Zones.TryZoneOf(other, out var otherZone))
            {
                throw new PlanningException($"section {other} is not a section of grid '{graph.Grid.Name}'");
            }

            // The other fault of a cross-country pair: isolated as well, from the state the first isolation leaves, and never re-energised.
            ctx.AlsoIsolated.Add(otherZone);
            second = Isolation.Plan(ctx, otherZone, other, isolation.After, isolation.AfterNetwork, ctx.FaultCurrent);
            isolation = isolation with { After = second.After, AfterNetwork = second.AfterNetwork };
            notes.Add($"cross-country fault: the ranking's best explanation is a pair of earth faults on different phases, in {isolate} and {other}; both sections are isolated and neither is re-energised");
        }
        var dead = new DeadArea(ctx, isolation);
        var factors = new double[ctx.Grid.Nodes.Length];
        for (var v = 0; v < factors.Length; v++)
        {
            var cut = ctx.Affected[v] && (!ctx.StartNetwork.IsEnergised(v) || !isolation.AfterNetwork.IsEnergised(v));
            factors[v] = cut ? options.ColdLoadFactor!.Value : 1.0;
        }

        var limits = new SupplyLimits(options.VoltageLimitPu, factors);
        var suspects = SplitRanking.Suspects(ctx);
        var avoid = suspects.Where(s => s.Zone != ctx.SuspectZone).Select(s => s.Zone).ToHashSet();
        if (ctx.StandingEarthFault)
        {
            // The standing earth fault may lie in another suspect: no tie closes onto one.
            avoid.UnionWith(SplitRanking.StillSuspect(ctx).Where(z => z != ctx.SuspectZone));
        }

        var restoration = Restoration.Plan(ctx, isolation, dead, limits, avoid, notes);
        var steps = StepAssembly.Build(ctx, isolation, second, dead, restoration.Chosen, notes);
        var replay = PlanReplay.Run(ctx, steps);
        if (replay.Violations.Count > 0)
        {
            throw new InvalidOperationException($"the planner made an unsafe step: {string.Join("; ", replay.Violations)}");
        }

        var final = limits.Check(replay.Final);
        var testOrder = TestOrders.For(ctx, suspects, notes, out var expectedReenergisations, out var expectedInterruptions);
        var searchFirst = ctx.StandingEarthFault && !testOrder.IsEmpty && ranking is not null
            && ctx.ProbabilityOfZone[ctx.SuspectZone] < options.SplitTopShare;
        if (searchFirst)
        {
            // A network that may run with an earth fault is searched before anyone is cut off for a section that is only perhaps faulted.
            var first = new SwitchingStep(1, StepAction.Verify, null, null, [], TimeSpan.Zero,
                $"search first: the ranking is split ({isolate} only {Words.Probability(ctx.ProbabilityOfZone[ctx.SuspectZone])} likely) and the network may run with the earth fault, so carry out the earth-fault search of the test order, watching U0; the steps below isolate {isolate} and apply only if the search ends there (for another section, plan for the section found); their minutes count from the end of the search");
            steps = [first, .. steps.Select(s => s with { Order = s.Order + 1 })];
        }

        var testViolations = TestOrderReplay.Violations(ctx, testOrder);
        if (testViolations.Count > 0)
        {
            throw new InvalidOperationException($"the planner made an unsafe test order: {string.Join("; ", testViolations)}");
        }

        var isolated = alsoIsolate is { } also && also != isolate ? new List<SectionId> { isolate, also } : [isolate];
        var named = new List<SectionId>(isolated);
        named.AddRange(testOrder.SelectMany(t => t.ReenergisesSections.Concat(t.CutsOffSections).Concat(t.Branches.SelectMany(b => b.FaultIn))));
        return new SwitchingPlan(
            [.. steps],
            [.. isolated],
            [.. named.Distinct().Select(id => new PlanSection(id, graph.Sections[id].Segments))],
            options.ColdLoadFactor!.Value,
            options.VoltageLimitPu,
            replay.Restored,
            replay.Unserved,
            replay.CustomerMinutes,
            new FinalSupply(
                final.MinimumVoltagePu,
                final.MinimumVoltageNode >= 0 ? ctx.Grid.Nodes[final.MinimumVoltageNode].Id : null,
                final.MaximumLoadingPercent,
                final.MaximumLoadingSegment >= 0 ? ctx.Grid.Segments[final.MaximumLoadingSegment].Id : null),
            testOrder,
            expectedReenergisations,
            Cautions.All,
            [.. Approximations(ctx, steps, final), .. notes.Distinct()])
        {
            SearchFirst = searchFirst,
            ExpectedCustomerInterruptions = expectedInterruptions,
        };
    }

    /// <summary>
    /// The return to normal after the repair, from the state <paramref name="plan"/> leaves: clearance, then
    /// every device back to its normal position without paralleling feeders or substations. Throws
    /// <see cref="PlanningException"/> where no safe order exists.
    /// </summary>
    public static ReturnPlan PlanReturn(NetworkGraph graph, Incident incident, SwitchingPlan plan, SwitchingOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        ArgumentNullException.ThrowIfNull(plan);
        options ??= SwitchingOptions.Default;
        options.Validate();
        return ReturnToNormal.Plan(graph, incident, plan, options);
    }

    /// <summary>
    /// The return to normal from the switch positions <paramref name="states"/> as carried out (not as planned):
    /// the clearance of <paramref name="plan"/>'s earths and locks (none when null), then every device back to its
    /// normal position. Throws <see cref="PlanningException"/> where no safe order exists.
    /// </summary>
    public static ReturnPlan PlanReturnFrom(NetworkGraph graph, SwitchStates states, SwitchingPlan? plan, SwitchingOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(states);
        options ??= SwitchingOptions.Default;
        options.Validate();
        return ReturnToNormal.From(graph, states, plan, options);
    }

    /// <summary>Plans for the ranking's most likely section, or says why it cannot.</summary>
    public static bool TryPlan(NetworkGraph graph, Incident incident, RankingResult ranking, [NotNullWhen(true)] out SwitchingPlan? plan, [NotNullWhen(false)] out string? problem, SwitchingOptions? options = null)
    {
        try
        {
            plan = Plan(graph, incident, ranking, options);
            problem = null;
            return true;
        }
        catch (PlanningException e)
        {
            plan = null;
            problem = e.Message;
            return false;
        }
    }

    private static IEnumerable<string> Approximations(PlanningContext ctx, IReadOnlyList<SwitchingStep> steps, SupplyVerdict final)
    {
        var o = ctx.Options;
        yield return "load flow: backward/forward sweep per phase, constant-power loads (power factor 0.95 lagging where loadKvar is absent), segment impedance (r1 + j·x1)·length, switches ideal, every busbar at 1.0 pu";
        yield return $"cold-load factor {Words.Number(o.ColdLoadFactor!.Value)} on the load of every node that was without supply; voltage limit {Words.Number(o.VoltageLimitPu)} pu; ampacityA per line type; transformerRatedMva where given";
        yield return "field indicators in the part without supply that the incident gives no field reading of are read before the first close, a default travel time after the start";
        yield return $"timeline: one step after another (the control room switches one device at a time); remote operation {Words.Number(o.RemoteOperationTime.TotalMinutes)} min, manual {Words.Number(o.ManualOperationTime.TotalMinutes)} min after the crew's arrival, fuse replacement {Words.Number(o.FuseReplacementTime.TotalMinutes)} min";
        yield return CrewWords.Assumption(ctx.Grid);
        var defaulted = steps.Where(s => s.Device is { } d && !ctx.Grid.Switch(d).Remote && ctx.Grid.Switch(d).TravelTime is null)
            .Select(s => s.Device!.Value).Distinct().ToList();
        if (defaulted.Count > 0)
        {
            yield return $"travel time {Words.Number(o.DefaultTravelTime.TotalMinutes)} min assumed for {Words.List(defaulted)} (no travelMinutes in the grid)";
        }

        yield return "customer minutes (IEEE 1366 CMI) count from the start of the incident to the last switching step; the repair of the isolated section is not included";
        yield return "restoration closes only switches between a live and a dead part: dead parts are not joined to each other and the live network is not reconfigured to make room";
        if (!final.Holds)
        {
            yield return $"the final state breaks a limit outside what the plan switched: {final.Violation}";
        }
    }
}
