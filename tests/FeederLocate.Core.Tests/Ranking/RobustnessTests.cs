using System.Collections.Immutable;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Tests.Support;
using static FeederLocate.Core.Evidence.IndicatorState;

namespace FeederLocate.Core.Tests.Ranking;

/// <summary>
/// What goes wrong in the field: a wrong indication, a lost report, a wrong switch state in the model,
/// an indicator the operator distrusts, a flag read after it may have reset.
/// </summary>
public class RobustnessTests
{
    /// <summary>A bolted earth fault in the middle of S108 on the solid sample grid, every indicator as the engine expects, no records.</summary>
    private static (Grid Grid, Incident Incident) SolidS108()
    {
        var grid = Grids.Sample("solid");
        var result = FaultCurrents.At(grid, new FaultCase(new SegmentId("S108"), 0.5, FaultType.LG));
        return (grid, EngineIncidents.Exact(result, new SwitchId("CB-A1")));
    }

    [Theory]
    // FPI-A1-01 at the head of A1 misses: FPI-A1-04 and FPI-A1-11 further out both saw the fault pass, and
    // CB-A1 tripped; no fault that spares FPI-A1-01 explains them.
    [InlineData("FPI-A1-01", None)]
    // FPI-A1-04 misses: FPI-A1-01 before it and FPI-A1-11 after it both point forward.
    [InlineData("FPI-A1-04", None)]
    // FPI-A1-16 at the end of A1, facing the open tie, reports falsely: it faces the source, so no fault on a
    // feeder fed from A drives phase current through it toward its segment; the rest place the fault on S108.
    [InlineData("FPI-A1-16", Forward)]
    public void A_single_wrong_indication_is_outvoted_by_the_rest(string indicator, IndicatorState wrongState)
    {
        var (grid, incident) = SolidS108();
        var wrong = incident.With(indicator, i => i with { State = wrongState });
        Assert.NotEqual(incident.IndicationOf(new IndicatorId(indicator))!.State, wrong.IndicationOf(new IndicatorId(indicator))!.State);

        var ranking = FaultRanking.Rank(grid, wrong);

        Assert.Equal("SEC-S108", ranking.Sections[0].Id.Value);
        Assert.True(ranking.Consistent);
    }

    [Fact]
    public void A_lost_report_carries_no_evidence_and_ranks_as_an_unknown_state()
    {
        // FPI-A1-14 (just beyond LB-A1-4) is what keeps the fault off SEC-S110. Without it the fault may lie
        // beyond FPI-A1-11 anywhere on the trunk; SEC-S108 still leads on its length and fault rate.
        var (grid, incident) = SolidS108();
        var lost = incident.Without("FPI-A1-14");
        var unknown = incident.With("FPI-A1-14", i => i with { State = Unknown });

        var ranking = FaultRanking.Rank(grid, lost);

        AssertSameRanking(FaultRanking.Rank(grid, unknown), ranking);
        Assert.Equal("SEC-S108", ranking.Sections[0].Id.Value);
        var full = FaultRanking.Rank(grid, incident);
        Assert.True(ranking.Sections[0].Probability < full.Sections[0].Probability, "losing FPI-A1-14 leaves SEC-S110 open, so SEC-S108 must lose some probability");
    }

    [Fact]
    public void A_lost_report_of_the_only_indicator_at_the_section_entrance_keeps_the_true_section_in_the_top_three()
    {
        // Isolated grid, standing earth fault on S207 (Rf 300 Ω). FPI-A2-08 at the entrance of SEC-S206 is the
        // only indicator that tells that lateral from the rest of A2 beyond FPI-A2-05; without it
        // SEC-S204, SEC-S206 and the sections beyond LB-A2-3 compete.
        var grid = Grids.Sample("isolated");
        var result = FaultCurrents.At(grid, new FaultCase(new SegmentId("S207"), 0.5, FaultType.LG, 300));
        var incident = EngineIncidents.Exact(result, null, EngineIncidents.FeederRecords(grid, result, phase: false, earth: true));
        Assert.Equal(Fault, incident.IndicationOf(new IndicatorId("FPI-A2-08"))!.State);

        var ranking = FaultRanking.Rank(grid, incident.Without("FPI-A2-08"));

        AssertSameRanking(FaultRanking.Rank(grid, incident.With("FPI-A2-08", i => i with { State = Unknown })), ranking);
        Assert.Contains("SEC-S206", ranking.Sections.Take(3).Select(s => s.Id.Value));
    }

    public static TheoryData<bool, string> WrongSwitchStates => new()
    {
        // In the field LB-A1-4 is open and NO-A1-B1 closed: B1 feeds A1's tail through FPI-A1-16. An LL fault
        // on S114 blows FU-A1-6 and drives current out of B1 through FPI-B1-01, FPI-B1-04, FPI-B1-11 and
        // FPI-A1-16 (forward: it now faces away from its source). The model is told the normal states. There the
        // forward arrows on B1 point to B1's trunk beyond FPI-B1-11, where FU-A1-6 would not have seen the
        // fault, and FPI-A1-16 faces substation A's source, so nothing drives phase current through it
        // toward its segment: the best explanation lies outside the tripped device's zone and leaves
        // FPI-A1-16 unexplained.
        { true, "FPI-A1-16" },

        // The other way round: the field is in the normal state, the model is told B1 feeds A1's tail. The
        // fault on S114 is fed from A, so FPI-A1-01, FPI-A1-04, FPI-A1-11 and FPI-A1-14 point forward and B1's
        // indicators stay silent. In the model FPI-A1-14 now faces its source (B) at the dead end of S110: it
        // can report forward for no fault, and a fault beyond FPI-A1-11 on A's side lies outside FU-A1-6's zone.
        { false, "FPI-A1-14" },
    };

    [Theory]
    [MemberData(nameof(WrongSwitchStates))]
    public void A_wrong_switch_state_in_the_model_is_flagged_with_the_indications_it_contradicts(bool tailFedFromB1InTheField, string disagreeing)
    {
        var grid = Grids.Sample("solid");
        var tailFromB1 = new Dictionary<SwitchId, SwitchPosition>
        {
            [new SwitchId("LB-A1-4")] = SwitchPosition.Open,
            [new SwitchId("NO-A1-B1")] = SwitchPosition.Closed,
        };
        var field = EngineIncidents.Network(grid, tailFedFromB1InTheField ? tailFromB1 : null);
        var result = FaultCurrents.At(field, new FaultCase(new SegmentId("S114"), 0.5, FaultType.LL));
        var incident = EngineIncidents.Exact(result, new SwitchId("FU-A1-6"), deviations: tailFedFromB1InTheField ? null : tailFromB1);

        var ranking = FaultRanking.Rank(grid, incident);

        Assert.False(ranking.Consistent);
        Assert.Equal([disagreeing], ranking.Disagreeing.Select(c => c.Indicator.Value));
        var check = ranking.Disagreeing[0];
        Assert.Equal(Forward, check.Observed);
        Assert.Equal(None, check.Expected);

        // Told the field's switch states, the same indications are consistent.
        var told = incident with { SwitchStates = field.States.Deviations().ToImmutableDictionary() };
        Assert.True(FaultRanking.Rank(grid, told).Consistent);
    }

    [Fact]
    public void An_indication_marked_suspect_is_left_out_and_ranks_as_if_never_given()
    {
        // FPI-A1-11 is the indicator that places the fault beyond LB-A1-3; marked suspect it must count for nothing.
        var (grid, incident) = SolidS108();
        var suspect = incident.With("FPI-A1-11", i => i with { Suspect = true });

        var ranking = FaultRanking.Rank(grid, suspect);

        Assert.Equal(["FPI-A1-11"], ranking.LeftOut.Select(i => i.Value));
        AssertSameRanking(FaultRanking.Rank(grid, incident.Without("FPI-A1-11")), ranking);
        Assert.Contains(ranking.Assumptions, a => a.Contains("FPI-A1-11", StringComparison.Ordinal));

        // It mattered: trusted, it moves the ranking.
        var trusted = FaultRanking.Rank(grid, incident);
        Assert.Empty(trusted.LeftOut);
        Assert.NotEqual(trusted.Sections[0].Probability, ranking.Sections.Single(s => s.Id == trusted.Sections[0].Id).Probability);
    }

    [Fact]
    public void A_flag_read_after_its_reset_time_carries_no_weight_at_all()
    {
        // CB-A1 tripped; the trunk indicators place the fault beyond FPI-A1-11 and not beyond FPI-A1-14, and
        // the field-read FPI-A1-17 (phase element, flag resets after 120 min) on the lateral behind DS-A1-5
        // shows fault: it pulls toward SEC-S112. Read 30 min after the fault the flag is fresh; read after
        // 180 min it may have reset (and been set again by something else): it says nothing, so the ranking
        // is exactly the one without it (common practice: a reset flag carries no information on the fault).
        var grid = Grids.Sample("solid");
        Assert.Equal(120, grid.Indicator(new IndicatorId("FPI-A1-17")).ResetMinutes);
        var incident = EngineIncidents.WithIndications(new SwitchId("CB-A1"), FaultType.LG,
            ("FPI-A1-01", Forward), ("FPI-A1-04", Fault), ("FPI-A1-11", Forward), ("FPI-A1-14", None));
        Incident WithLateral(double? readAfterMinutes, IndicatorState state = Fault) => incident with
        {
            Indications = incident.Indications.Add(new Indication(new IndicatorId("FPI-A1-17"), state, IndicationSource.Field,
                readAfterMinutes is { } m ? incident.ReportedAt.AddMinutes(m) : null)),
        };

        double Lateral(Incident i) => FaultRanking.Rank(grid, i).Sections.Single(s => s.Id.Value == "SEC-S112").Probability;
        var without = Lateral(incident);
        var fresh = Lateral(WithLateral(30));
        var undated = Lateral(WithLateral(null));

        Assert.True(fresh > without, $"the fresh flag pulls toward SEC-S112: {without:F3} -> {fresh:F3}");
        Assert.Equal(fresh, undated);
        foreach (var state in new[] { Fault, None })
        {
            var expired = FaultRanking.Rank(grid, WithLateral(180, state));
            AssertSameRanking(FaultRanking.Rank(grid, incident), expired);
            Assert.Equal(["FPI-A1-17"], expired.Expired.Select(i => i.Value));
            Assert.Contains(expired.Assumptions, a => a.Contains("FPI-A1-17", StringComparison.Ordinal));
        }
    }

    [Fact]
    public void A_reading_age_counts_from_the_fault_time_where_it_is_given()
    {
        // The same reading 100 min after the report: fresh when the fault began at the report (100 < 120 min),
        // expired when the fault began 60 min before it (160 > 120 min, FPI-A1-17's resetMinutes).
        var grid = Grids.Sample("solid");
        var incident = EngineIncidents.WithIndications(new SwitchId("CB-A1"), FaultType.LG,
            ("FPI-A1-01", Forward), ("FPI-A1-04", Fault), ("FPI-A1-11", Forward), ("FPI-A1-14", None));
        var read = incident with
        {
            Indications = incident.Indications.Add(new Indication(new IndicatorId("FPI-A1-17"), Fault, IndicationSource.Field, incident.ReportedAt.AddMinutes(100))),
        };

        Assert.Empty(FaultRanking.Rank(grid, read).Expired);
        Assert.Empty(FaultRanking.Rank(grid, read with { FaultAt = incident.ReportedAt }).Expired);
        var early = FaultRanking.Rank(grid, read with { FaultAt = incident.ReportedAt.AddMinutes(-60) });
        Assert.Equal(["FPI-A1-17"], early.Expired.Select(i => i.Value));
        AssertSameRanking(FaultRanking.Rank(grid, incident with { FaultAt = incident.ReportedAt.AddMinutes(-60) }), early);
    }

    [Fact]
    public void A_flag_read_before_a_trial_reenergisation_weighs_less()
    {
        // Read before the latest trial re-energisation, the flag shows the state before it: it still pulls, less (StaleWeight 0.3).
        var grid = Grids.Sample("solid");
        var incident = EngineIncidents.WithIndications(new SwitchId("CB-A1"), FaultType.LG,
            ("FPI-A1-01", Forward), ("FPI-A1-04", Fault), ("FPI-A1-11", Forward), ("FPI-A1-14", None));
        var lateral = incident with
        {
            Indications = incident.Indications.Add(new Indication(new IndicatorId("FPI-A1-17"), Fault, IndicationSource.Field, incident.ReportedAt.AddMinutes(10))),
        };

        double Lateral(Incident i) => FaultRanking.Rank(grid, i).Sections.Single(s => s.Id.Value == "SEC-S112").Probability;
        var without = Lateral(incident);
        var fresh = Lateral(lateral);
        var stale = Lateral(lateral with { ReenergisedAt = incident.ReportedAt.AddMinutes(20) });

        Assert.True(stale < fresh, $"stale {stale:F3} should pull less than fresh {fresh:F3}");
        Assert.True(stale > without, $"stale {stale:F3} still pulls (weight 0.3, not 0) from {without:F3}");
    }

    private static void AssertSameRanking(RankingResult expected, RankingResult actual)
    {
        Assert.Equal(expected.Segments.Select(s => (s.Id, s.Probability)), actual.Segments.Select(s => (s.Id, s.Probability)));
        Assert.Equal(expected.Sections.Select(s => (s.Id, s.Probability)), actual.Sections.Select(s => (s.Id, s.Probability)));
        Assert.Equal(expected.Consistent, actual.Consistent);
    }
}

public class NearBusFaultTests
{
    [Theory]
    [InlineData("S101", 0.5, 2.0)]
    [InlineData("S201", 0.3, 1.2)]
    public void A_low_resistance_earth_fault_near_the_bus_with_exact_records_ranks_its_section_first(string segment, double position, double rfOhm)
    {
        // Solid earthing, every indication and every feeder-breaker record (phase, residual, U0) exactly as
        // the engine predicts: near the bus the current changes fast with Rf, so the resistance grid must be
        // fine there, and the residual at the faulted breaker (equal to its phase current) counts once.
        var grid = Grids.Sample("solid");
        var network = Grids.Normal(grid);
        var result = FaultCurrents.At(network, new FaultCase(new SegmentId(segment), position, FaultType.LG, rfOhm));
        var incident = EngineIncidents.Exact(
            result,
            EngineIncidents.TrippingDevice(network, new SegmentId(segment)),
            EngineIncidents.FeederRecords(grid, result, phase: true, earth: true));

        var ranking = FaultRanking.Rank(grid, incident);

        var trueSection = new FeederLocate.Core.Topology.NetworkGraph(grid).Sections.OfSegment(grid.SegmentIndex(new SegmentId(segment))).Id;
        Assert.Equal(trueSection, ranking.Sections[0].Id);
    }
}
