using System.Collections.Immutable;
using CsCheck;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;

namespace FeederLocate.Core.Tests.Formats;

/// <summary>What the writers write, the readers read back unchanged: element by element, and the same text again.</summary>
public class RoundTripPropertyTests
{
    private static readonly Gen<SyntheticGridOptions> GridOptions = Gen.Select(
        Gen.Int[1, 200], Gen.Int, Gen.Enum<GroundingScheme>(), Gen.Double[0, 1], Gen.Int[1, 60], Gen.Int[1, 6], Gen.Int[1, 3],
        (segments, seed, scheme, share, perFeeder, perSwitch, substations) =>
            new SyntheticGridOptions(segments, seed, scheme, share, perFeeder, perSwitch, substations))
        .Select(Gen.Int[0, 3], Gen.Int[1, 4], (options, bases, crews) => options with { CrewBases = bases, CrewsPerBase = crews });

    private static readonly Lazy<Grid> SolidSample = new(() => Grids.Sample("solid"));

    public static TheoryData<string> Schemes => new() { "isolated", "resonant", "solid", "impedance" };

    [Fact]
    public void Written_synthetic_grid_reads_back_equal()
    {
        GridOptions.Sample(options => AssertRoundTrip(SyntheticGrid.Generate(options)), iter: 100);
    }

    [Fact]
    public void Written_grid_with_arbitrary_numbers_reads_back_equal()
    {
        // Full-precision doubles in every numeric field the generator leaves at round values.
        var gen = Gen.Select(GridOptions, Gen.Double[1e-6, 1e4].Array[16], Gen.Double[1e-4, 60].Array[200], Gen.Double[-1e6, 1e6].Array[2]);
        gen.Sample((options, typeValues, lengths, xy) =>
        {
            var grid = SyntheticGrid.Generate(options);
            var types = grid.LineTypes.Select((t, i) => t with
            {
                R1OhmPerKm = typeValues[(8 * i) + 0],
                X1OhmPerKm = typeValues[(8 * i) + 1],
                R0OhmPerKm = typeValues[(8 * i) + 2],
                X0OhmPerKm = typeValues[(8 * i) + 3],
                C0NfPerKm = typeValues[(8 * i) + 4],
                AmpacityA = typeValues[(8 * i) + 5],
                FaultsPer100KmYear = i == 0 ? typeValues[(8 * i) + 6] : null,
                CrossSectionMm2 = i == 1 ? typeValues[(8 * i) + 7] : null,
            });
            var nodes = grid.Nodes.Select((n, i) => n with { X = xy[0] / (i + 1), Y = xy[1] * (i + 1), LoadKvar = i % 3 == 0 ? -xy[0] : null });
            var segments = grid.Segments.Select((s, i) => s with { LengthKm = lengths[i % lengths.Length] });
            AssertRoundTrip(Grid.Create(grid.Name, 60, types, grid.Substations, nodes, segments, grid.Switches, grid.Indicators));
        }, iter: 100);
    }

    [Theory]
    [MemberData(nameof(Schemes))]
    public void Written_sample_grid_reads_back_equal(string scheme)
    {
        AssertRoundTrip(Grids.Sample(scheme));
    }

    [Theory]
    [MemberData(nameof(Schemes))]
    public void Written_tiny_fen_grid_reads_back_equal(string scheme)
    {
        AssertRoundTrip(Grids.TinyFen(scheme));
    }

    [Fact]
    public void Written_incident_reads_back_equal()
    {
        var grid = SolidSample.Value;
        Incidents(grid).Sample(incident =>
        {
            var text = IncidentWriter.Write(incident);
            var read = IncidentReader.Parse(text, grid);

            Assert.True(read.Succeeded, string.Join("\n", read.Issues) + "\n" + text);
            Assert.Empty(read.Issues);
            ModelAssert.Equal(incident, read.Value!);
            Assert.Equal(text, IncidentWriter.Write(read.Value!));
        }, iter: 200);
    }

    [Theory]
    [InlineData("solid-lg-trip-a1")]
    [InlineData("isolated-standing-earth-fault-a2")]
    [InlineData("resonant-standing-earth-fault-b1")]
    [InlineData("impedance-lg-trip-a2")]
    [InlineData("solid-ll-a1-tail-fed-from-b1")]
    [InlineData("solid-lll-a1-wrong-indication")]
    public void Written_sample_incident_reads_back_equal(string name)
    {
        var grid = Grids.Sample(name.Split('-')[0]);
        var incident = IncidentReader.Parse(RepositoryFiles.Read("sample-grid", "incidents", $"{name}.incident.json"), grid).ValueOrThrow();

        var read = IncidentReader.Parse(IncidentWriter.Write(incident), grid);

        Assert.True(read.Succeeded, string.Join("\n", read.Issues));
        ModelAssert.Equal(incident, read.Value!);
    }

    private static void AssertRoundTrip(Grid grid)
    {
        var text = GridWriter.Write(grid);
        var read = GridReader.Parse(text);

        Assert.True(read.Succeeded, string.Join("\n", read.Issues));
        Assert.Empty(read.Warnings);
        ModelAssert.Equal(grid, read.Value!);
        Assert.Equal(text, GridWriter.Write(read.Value!));
    }

    /// <summary>Random incidents over <paramref name="grid"/>: each indicator listed or not, with a state its kind can report.</summary>
    private static Gen<Incident> Incidents(Grid grid)
    {
        var start = new DateTimeOffset(2020, 1, 1, 0, 0, 0, TimeSpan.Zero).Ticks;
        var end = new DateTimeOffset(2035, 1, 1, 0, 0, 0, TimeSpan.Zero).Ticks;
        var time = Gen.Select(Gen.Long[start, end], Gen.Int[-48, 56], (ticks, quarters) => new DateTimeOffset(ticks, TimeSpan.FromMinutes(15 * quarters)));
        var trippable = grid.Switches.Where(s => s.Kind is SwitchKind.Breaker or SwitchKind.Recloser or SwitchKind.Fuse).Select(s => s.Id).ToArray();
        var breakers = grid.Switches.Where(s => s.Kind == SwitchKind.Breaker).Select(s => s.Id).ToArray();
        var number = Gen.Double[0, 20_000].Nullable();
        var measurement = Gen.Select(Gen.Int[0, breakers.Length - 1], number, number, number,
            (device, phase, residual, neutral) => new SubstationMeasurement(breakers[device], phase, residual, neutral));
        var indication = Gen.Select(Gen.Bool, Gen.Int[0, 3], Gen.Bool, time.Nullable(), Gen.Bool);
        FaultType?[] types = [FaultType.LG, FaultType.LL, FaultType.LLG, FaultType.LLL, null];

        return Gen.Select(Bare(grid, time, trippable, measurement, indication, types), Protection(grid), (incident, protection) => protection(incident));
    }

    /// <summary>Random protection context: fault time before every reading, reclosing, fuses and relays, each present or not.</summary>
    private static Gen<Func<Incident, Incident>> Protection(Grid grid)
    {
        var reclosers = grid.Switches.Where(s => s.Kind is SwitchKind.Breaker or SwitchKind.Recloser).Select(s => s.Id).ToArray();
        var fuses = grid.Switches.Where(s => s.Kind == SwitchKind.Fuse).Select(s => s.Id).ToArray();
        var relay = Gen.Select(Gen.Int[0, 3], Gen.Double[0, 40].Nullable(), (direction, x) => (direction, x));
        return Gen.Select(
            Gen.Int[-1, 600],
            Gen.Select(Gen.Int[-1, reclosers.Length - 1], Gen.Int[0, Reclosing.MaximumAttempts], Gen.Bool, (d, a, ok) => (d, a, ok)),
            Gen.Int[0, 2].Array[fuses.Length],
            relay.Array[reclosers.Length],
            (minutesBefore, reclosing, fuseStates, relays) => (Func<Incident, Incident>)(incident =>
            {
                var earliest = incident.Indications.Select(i => i.ReadAt).Where(t => t is not null).Append(incident.ReportedAt).Min()!.Value;
                return incident with
                {
                    FaultAt = minutesBefore < 0 ? null : earliest.AddMinutes(-minutesBefore),
                    Reclosing = reclosing.d < 0 ? null : new Reclosing(reclosers[reclosing.d], reclosing.a, reclosing.ok ? ReclosingResult.Success : ReclosingResult.Lockout),
                    Fuses = fuseStates.Select((f, i) => (f, fuses[i])).Where(x => x.f > 0)
                        .ToImmutableDictionary(x => x.Item2, x => x.f == 1 ? FuseCondition.Blown : FuseCondition.Intact),
                    Relays = [.. relays.Select((r, i) => (r, reclosers[i]))
                        .Where(x => x.r.direction < 3 || x.r.x is not null)
                        .Select(x => new RelayResult(x.Item2, x.r.direction < 3 ? (EarthFaultDirection)x.r.direction : null, x.r.x))],
                };
            }));
    }

    private static Gen<Incident> Bare(Grid grid, Gen<DateTimeOffset> time, SwitchId[] trippable, Gen<SubstationMeasurement> measurement, Gen<(bool, int, bool, DateTimeOffset?, bool)> indication, FaultType?[] types)
    {
        return Gen.Select(
            time,
            Gen.Bool,
            Gen.Int[0, 2].Array[grid.Switches.Length],
            Gen.Int[-1, trippable.Length - 1],
            Gen.Int[0, types.Length - 1],
            measurement.Array[0, 3],
            indication.Array[grid.Indicators.Length],
            (reportedAt, named, positions, tripped, type, measurements, indications) => new Incident(
                reportedAt,
                named ? "../marrowdell-solid.grid.json" : null,
                positions.Select((p, i) => (p, grid.Switches[i].Id)).Where(x => x.p > 0)
                    .ToImmutableDictionary(x => x.Id, x => x.p == 1 ? SwitchPosition.Open : SwitchPosition.Closed),
                tripped < 0 ? null : trippable[tripped],
                types[type],
                [.. measurements.DistinctBy(m => m.Device)], // one record per device, as the reader demands
                [.. indications.Select((x, i) => (x, grid.Indicators[i])).Where(p => p.x.Item1).Select(p =>
                {
                    var (_, state, field, readAt, suspect) = p.x;
                    IndicatorState[] allowed = p.Item2.Directional
                        ? [IndicatorState.Forward, IndicatorState.Reverse, IndicatorState.None, IndicatorState.Unknown]
                        : [IndicatorState.Fault, IndicatorState.None, IndicatorState.Unknown];
                    return new Indication(p.Item2.Id, allowed[state % allowed.Length], field ? IndicationSource.Field : IndicationSource.Remote, readAt, suspect);
                })]));
    }
}

public class GroundingRoundTripTests
{
    [Theory]
    [InlineData("solid")]
    [InlineData("impedance")]
    public void Damping_given_on_any_scheme_survives_a_round_trip(string scheme)
    {
        var text = RepositoryFiles.Read("tests", "FeederLocate.Core.Tests", "ReferenceCases", "TinyFen", $"tiny-{scheme}.grid.json")
            .Replace($"\"scheme\": \"{scheme}\"", $"\"scheme\": \"{scheme}\", \"dampingPercent\": 4", StringComparison.Ordinal);
        var grid = FeederLocate.Core.Formats.GridReader.Parse(text).ValueOrThrow();

        var again = FeederLocate.Core.Formats.GridReader.Parse(FeederLocate.Core.Formats.GridWriter.Write(grid)).ValueOrThrow();

        Assert.Equal(4, grid.Substations[0].Grounding.DampingPercent);
        Assert.Equal(grid.Substations[0].Grounding, again.Substations[0].Grounding);
    }
}
