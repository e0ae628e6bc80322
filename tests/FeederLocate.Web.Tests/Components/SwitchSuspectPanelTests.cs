using Bunit;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Web.Components.Workspace;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

public class SwitchSuspectPanelTests : ComponentTest
{
    private static readonly SwitchSuspect Tie = new(new SwitchId("NO-A1-B1"), SwitchPosition.Closed, 0.824, new SectionId("SEC-S110"), 0.781);

    [Fact]
    public void Each_suspect_is_a_warning_naming_the_switch_its_position_and_where_the_fault_then_lies()
    {
        var cut = Render<SwitchSuspectPanel>(p => p.Add(c => c.Suspects, [Tie]).Add(c => c.MayRecord, true));

        var item = cut.Find("[data-testid=switch-suspect-NO-A1-B1]").TextContent;
        Assert.Contains("NO-A1-B1 closed (82 %)", item, StringComparison.Ordinal);
        Assert.Contains("SEC-S110 (78 %)", item, StringComparison.Ordinal);
        Assert.Equal("alert", cut.Find("[data-testid=switch-suspects]").GetAttribute("role"));
    }

    [Fact]
    public void One_click_asks_for_the_confirmation_of_the_suspected_position()
    {
        SwitchPositionRequest? asked = null;
        var cut = Render<SwitchSuspectPanel>(p => p.Add(c => c.Suspects, [Tie]).Add(c => c.MayRecord, true)
            .Add(c => c.OnRecord, (SwitchPositionRequest r) => asked = r));

        cut.Find("[data-testid=switch-suspect-record-NO-A1-B1]").Click();

        Assert.Equal(new SwitchPositionRequest(new SwitchId("NO-A1-B1"), SwitchPosition.Closed), asked);
    }

    [Fact]
    public void A_viewer_sees_the_warning_without_the_button_and_nothing_shows_without_suspects()
    {
        var viewer = Render<SwitchSuspectPanel>(p => p.Add(c => c.Suspects, [Tie]).Add(c => c.MayRecord, false));
        Assert.Single(viewer.FindAll("[data-testid=switch-suspect-NO-A1-B1]"));
        Assert.Empty(viewer.FindAll("button"));

        var none = Render<SwitchSuspectPanel>(p => p.Add(c => c.Suspects, []));
        Assert.Empty(none.FindAll("[data-testid=switch-suspects]"));
    }
}
