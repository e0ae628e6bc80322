using System.Text.RegularExpressions;
using FeederLocate.Application.Analysis;
using FeederLocate.Application.History;
using FeederLocate.Application.Lifecycle;
using FeederLocate.Application.Naming;
using FeederLocate.Application.Tests.Support;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Application.Tests.Naming;

/// <summary>Steps as people read them: plain words, sections by feeder and bounding devices, no segment ids.</summary>
public sealed class StepWordsTests : IDisposable
{
    private readonly TestLog _test = new();

    public void Dispose() => _test.Dispose();

    public static TheoryData<string> Schemes() => ["isolated", "resonant", "solid", "impedance"];

    [Theory]
    [MemberData(nameof(Schemes))]
    public async Task Every_step_of_a_plan_names_its_action_in_words_and_its_segments_by_their_sections(string scheme)
    {
        var graph = Samples.Graph(scheme);
        var breaker = graph.Grid.Switches.First(s => s.Kind == SwitchKind.Breaker).Id;
        var id = _test.Log.Open(graph.Grid, breaker, FaultType.LG, TestClock.Start, Samples.Operator);
        var plan = (await new IncidentAnalysis(new GridLearning(_test.Log), new CoreFaultRanker()).PlanAsync(graph, _test.Log.State(id))).Plan;
        Assert.NotNull(plan);
        var sections = GridNames.Sections(graph);
        // Proving dead, earthing and the permit act on segments: the order has steps of both kinds.
        Assert.Contains(plan.Steps, s => s.Device is null && s.Segments.Length > 0);

        foreach (var step in plan.Steps)
        {
            var text = StepWords.Describe(step, graph);

            Assert.StartsWith($"{step.Order}. {StepWords.Action(step.Action)}", text, StringComparison.Ordinal);
            Assert.DoesNotMatch(@"[a-z][A-Z]", StepWords.Action(step.Action));
            foreach (var segment in step.Device is null ? step.Segments : [])
            {
                Assert.DoesNotMatch($@"(?<![\w.-]){Regex.Escape(segment.Value)}(?![\w-])", text);
                Assert.Contains(sections[graph.Sections.OfSegment(graph.Grid.SegmentIndex(segment)).Id], text, StringComparison.Ordinal);
            }

            if (step.Device is { } device)
            {
                Assert.EndsWith(device.Value, text, StringComparison.Ordinal);
            }
        }
    }

    [Fact]
    public async Task The_board_line_gives_the_next_step_in_words_beside_the_ids_of_the_json()
    {
        var graph = Samples.Graph("solid");
        var id = _test.Log.Open(graph.Grid, new SwitchId("CB-A1"), FaultType.LG, TestClock.Start, Samples.Operator);
        var analysis = new IncidentAnalysis(new GridLearning(_test.Log), new CoreFaultRanker());
        var first = (await analysis.PlanAsync(graph, _test.Log.State(id))).Plan!.Steps[0];

        var line = await IncidentOverview.LineAsync(graph, _test.Log.State(id), analysis, TestClock.Start.AddMinutes(5));

        Assert.Equal(IncidentOverview.Describe(first), line.CurrentStep);
        Assert.Equal(StepWords.Describe(first, graph), line.CurrentStepInWords);
    }

    [Fact]
    public void A_step_on_segments_the_grid_does_not_have_keeps_their_ids()
    {
        var graph = Samples.Graph("solid");
        var step = new SwitchingStep(3, StepAction.Patrol, null, null, [new SegmentId("NOT-ON-THIS-GRID")], TimeSpan.Zero, "patrol");

        Assert.Equal("3. patrol NOT-ON-THIS-GRID", StepWords.Describe(step, graph));
    }

    [Theory]
    [InlineData(0.0, "0")]
    [InlineData(0.012345, "0.0123")]
    [InlineData(1.0, "1")]
    [InlineData(1.2345, "1.23")]
    [InlineData(12.345, "12.3")]
    [InlineData(123.45, "123")]
    [InlineData(1234.5, "1,230")]
    [InlineData(98_765.0, "98,800")]
    [InlineData(-4567.0, "-4,570")]
    [InlineData(double.PositiveInfinity, "–")]
    public void Figures_have_three_significant_digits_grouped_and_never_an_exponent(double value, string shown) =>
        Assert.Equal(shown, Figures.Significant(value));
}
