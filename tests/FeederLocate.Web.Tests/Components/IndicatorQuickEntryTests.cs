using Bunit;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Web.Components.Workspace;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

public class IndicatorQuickEntryTests : ComponentTest
{
    private readonly Web.Services.LoadedGrid _grid = LoadedGrids.Sample("solid");

    private (Indicator Indicator, IndicatorState State, bool Suspect)? Type(string name, string state)
    {
        (Indicator, IndicatorState, bool)? set = null;
        var cut = Render<IndicatorEntry>(p => p
            .Add(c => c.Indicators, _grid.Grid.Indicators)
            .Add(c => c.Current, new Dictionary<IndicatorId, Indication>())
            .Add(c => c.OnSet, e => set = e));

        cut.Find("[data-testid=quick-indicator]").Change(name);
        cut.Find("[data-testid=quick-state]").Change(state);
        cut.Find("[data-testid=indicator-quick-entry]").Submit();
        return set;
    }

    [Fact]
    public void Typing_the_end_of_a_name_and_the_first_letter_of_a_state_enters_it()
    {
        var set = Type("a1-04", "f");

        Assert.NotNull(set);
        Assert.Equal(new IndicatorId("FPI-A1-04"), set.Value.Indicator.Id);
        Assert.Equal(IndicatorState.Fault, set.Value.State);
    }

    [Fact]
    public void On_a_directional_indicator_f_means_forward_and_a_mark_works_too()
    {
        Assert.Equal(IndicatorState.Forward, Type("FPI-A1-01", "f")?.State);
        Assert.Equal(IndicatorState.Reverse, Type("FPI-A1-01", "<")?.State);
    }

    [Fact]
    public void A_name_that_fits_several_indicators_or_a_state_it_cannot_show_enters_nothing()
    {
        Assert.Null(Type("A1", "fault"));
        Assert.Null(Type("FPI-A1-01", "fault"));
    }
}
