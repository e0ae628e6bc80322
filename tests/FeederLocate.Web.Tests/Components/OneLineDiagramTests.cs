using Bunit;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Web.Components.OneLine;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

public class OneLineDiagramTests : ComponentTest
{
    private readonly Services.LoadedGrid _grid = LoadedGrids.Sample("solid");

    private DiagramState State(IReadOnlyDictionary<SectionId, double>? probability = null, IReadOnlyDictionary<IndicatorId, DiagramIndication>? indications = null) => new(
        _grid.Grid.Switches.Where(s => !s.NormallyOpen).Select(s => s.Id).ToHashSet(),
        _grid.Grid.Segments.Select(s => s.Id).ToHashSet(),
        indications ?? new Dictionary<IndicatorId, DiagramIndication>(),
        probability ?? new Dictionary<SectionId, double>(),
        new HashSet<SectionId>());

    [Fact]
    public void Cable_and_overhead_segments_are_drawn_differently()
    {
        var cut = Render<OneLineDiagram>(p => p.Add(c => c.Drawing, _grid.Drawing).Add(c => c.State, State()));

        var cables = _grid.Grid.Segments.Count(s => _grid.Grid.LineTypeOf(s).Construction == Construction.Cable);
        Assert.Equal(cables, cut.FindAll("polyline.segment.cable").Count);
        Assert.Equal(_grid.Grid.Segments.Length - cables, cut.FindAll("polyline.segment.overhead").Count);
    }

    [Fact]
    public void Open_switches_are_hollow_and_struck_through_and_say_so_in_words()
    {
        var cut = Render<OneLineDiagram>(p => p.Add(c => c.Drawing, _grid.Drawing).Add(c => c.State, State()));

        var tie = cut.Find("g[data-switch='NO-A1-B1']");
        Assert.Contains("open", tie.ClassList);
        Assert.Single(tie.QuerySelectorAll("line.gap"));
        Assert.Contains("NO-A1-B1, open", tie.GetAttribute("aria-label"), StringComparison.Ordinal);
        var breaker = cut.Find("g[data-switch='CB-A1']");
        Assert.Contains("closed", breaker.ClassList);
        Assert.Empty(breaker.QuerySelectorAll("line.gap"));
    }

    [Fact]
    public void An_indicator_shows_its_entered_state_with_a_mark_and_a_word()
    {
        var indications = new Dictionary<IndicatorId, DiagramIndication>
        {
            [new IndicatorId("FPI-A1-01")] = new(IndicatorState.Forward, false),
            [new IndicatorId("FPI-A1-04")] = new(IndicatorState.Fault, true),
        };

        var cut = Render<OneLineDiagram>(p => p.Add(c => c.Drawing, _grid.Drawing).Add(c => c.State, State(indications: indications)));

        cut.Find("g[data-indicator='FPI-A1-01'] text.mark").MarkupMatches("<text class=\"mark\" y=\"3.5\">▶</text>");
        Assert.Equal("fault", cut.Find("g[data-indicator='FPI-A1-04']").GetAttribute("data-state"));
        Assert.Single(cut.FindAll("g[data-indicator='FPI-A1-04'] line.distrust-mark"));
        Assert.Equal("unknown", cut.Find("g[data-indicator='FPI-A1-07']").GetAttribute("data-state"));
    }

    [Fact]
    public void A_suspect_section_is_shaded_and_labelled_with_its_probability()
    {
        var probability = new Dictionary<SectionId, double> { [new SectionId("SEC-S108")] = 0.72, [new SectionId("SEC-S112")] = 0.2 };

        var cut = Render<OneLineDiagram>(p => p.Add(c => c.Drawing, _grid.Drawing).Add(c => c.State, State(probability)));

        Assert.Equal("72 %", cut.Find("g[data-section-label='SEC-S108'] text").TextContent);
        var shaded = _grid.Drawing.Segments.Count(s => s.Section.Value is "SEC-S108" or "SEC-S112");
        Assert.Equal(shaded, cut.FindAll("polyline.suspect").Count);
    }

    [Fact]
    public void Clicking_an_indicator_or_a_switch_raises_its_callback_with_its_id()
    {
        IndicatorId? clickedIndicator = null;
        SwitchId? clickedSwitch = null;
        var cut = Render<OneLineDiagram>(p => p
            .Add(c => c.Drawing, _grid.Drawing)
            .Add(c => c.State, State())
            .Add(c => c.OnIndicatorClick, id => clickedIndicator = id)
            .Add(c => c.OnSwitchClick, id => clickedSwitch = id));

        cut.Find("g[data-indicator='FPI-A2-05']").Click();
        cut.Find("g[data-switch='LB-A1-4']").KeyDown("Enter");

        Assert.Equal(new IndicatorId("FPI-A2-05"), clickedIndicator);
        Assert.Equal(new SwitchId("LB-A1-4"), clickedSwitch);
    }
}

public class OneLineDiagramOnALargeGridTests : ComponentTest
{
    private static readonly FeederLocate.Web.Services.LoadedGrid Large = FeederLocate.Web.Services.LoadedGrid.Of("large",
        FeederLocate.Core.Synthetic.SyntheticGrid.Generate(new FeederLocate.Core.Synthetic.SyntheticGridOptions(10_000, Seed: 1)));

    private static DiagramState AllLive() => new(
        Large.Grid.Switches.Where(s => !s.NormallyOpen).Select(s => s.Id).ToHashSet(),
        Large.Grid.Segments.Select(s => s.Id).ToHashSet(),
        new Dictionary<IndicatorId, DiagramIndication>(),
        new Dictionary<SectionId, double>(),
        new HashSet<SectionId>());

    [Fact]
    public void Opened_on_a_section_it_draws_only_the_part_in_view()
    {
        var focus = Large.Graph.Sections.All[Large.Graph.Sections.All.Length / 2].Id;

        var cut = Render<OneLineDiagram>(p => p.Add(c => c.Drawing, Large.Drawing).Add(c => c.State, AllLive()).Add(c => c.Focus, new[] { focus }));

        var drawn = cut.FindAll("polyline.segment");
        Assert.InRange(drawn.Count, 1, 600);
        Assert.Contains(drawn, s => Large.Drawing.Segments.Single(d => d.Id.Value == s.GetAttribute("data-segment")).Section == focus);
        Assert.Equal("detail", cut.Find("[data-testid=oneline]").GetAttribute("data-mode"));
    }

    [Fact]
    public void The_whole_network_is_one_path_per_feeder_without_symbols()
    {
        var cut = Render<OneLineDiagram>(p => p.Add(c => c.Drawing, Large.Drawing).Add(c => c.State, AllLive()));

        Assert.Equal("overview", cut.Find("[data-testid=oneline]").GetAttribute("data-mode"));
        Assert.Equal(Large.Drawing.Feeders.Length, cut.FindAll("path.feeder-path").Count);
        Assert.Empty(cut.FindAll("g[data-indicator]"));
        Assert.Empty(cut.FindAll("polyline.segment"));
    }

    [Fact]
    public void Search_finds_a_device_and_brings_it_into_view()
    {
        var target = Large.Grid.Switches[Large.Grid.Switches.Length / 3];
        var cut = Render<OneLineDiagram>(p => p.Add(c => c.Drawing, Large.Drawing).Add(c => c.State, AllLive()));
        Assert.Empty(cut.FindAll($"g[data-switch='{target.Id}']"));

        cut.Find("[data-testid=diagram-search]").Input(target.Id.Value);
        cut.Find("[data-testid=search-matches] button").Click();

        Assert.Contains("found", cut.Find($"g[data-switch='{target.Id}']").ClassList);
    }
}
