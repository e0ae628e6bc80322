using Bunit;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Web.Components.Workspace;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

public class IndicatorQuickEntryTests : ComponentTest
{
    private readonly Web.Services.LoadedGrid _grid = LoadedGrids.Sample("solid");

    private (Indicator Indicator, IndicatorState State, bool Suspect, TimeOnly? ReadAt)? Type(string name, string state) => Type(name, state, null, null);

    private (Indicator Indicator, IndicatorState State, bool Suspect, TimeOnly? ReadAt)? Type(string name, string state, string? readAt, Func<TimeOnly, string?>? problem)
    {
        (Indicator, IndicatorState, bool, TimeOnly?)? set = null;
        var cut = Render<IndicatorEntry>(p => p
            .Add(c => c.Indicators, _grid.Grid.Indicators)
            .Add(c => c.Current, new Dictionary<IndicatorId, Indication>())
            .Add(c => c.OnSet, e => set = e)
            .Add(c => c.ReadAtProblem, problem));

        cut.Find("[data-testid=quick-indicator]").Change(name);
        cut.Find("[data-testid=quick-state]").Change(state);
        if (readAt is not null)
        {
            cut.Find("[data-testid=quick-read-at]").Change(readAt);
        }

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
    public void A_reading_time_typed_with_the_entry_goes_with_it_and_one_the_rule_refuses_is_not_entered()
    {
        Assert.Null(Type("a1-04", "f")?.ReadAt);
        Assert.Equal(new TimeOnly(7, 42), Type("a1-04", "f", "07:42", _ => null)?.ReadAt);
        Assert.Null(Type("a1-04", "f", "06:10", t => t < new TimeOnly(7, 0) ? "before the fault began" : null));
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
