using Bunit;
using FeederLocate.Application.Lifecycle;
using FeederLocate.Web.Components.Handover;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

public class HandoverSheetTests : ComponentTest
{
    private static readonly DateTimeOffset At = new(2026, 3, 1, 18, 0, 0, TimeSpan.Zero);

    [Fact]
    public void Each_open_incident_shows_its_stage_what_is_off_by_name_the_next_step_and_the_open_questions()
    {
        var incident = new HandoverIncident(7, "Marrowdell 20 kV", "isolated", 95.5, 410,
            [new HandoverSection("SEC-3", "A1: LB-A1-3 → LB-A1-4", 410)], "4. close NO-A1-B1", 23_450, "from the trip at 2026-03-01T16:25:00Z: 2 switching operations at the actual times, 1 at the plan's estimate",
            ["FPI-A1-07", "FPI-A1-08"], ["FPI-A1-04"], [], null);
        var cut = Render<HandoverSheet>(p => p.Add(c => c.Document, new HandoverDocument(At, [incident], [12])));

        Assert.Equal("isolated, 1 h 35 min since the fault", cut.Find("[data-testid=handover-stage-7]").TextContent);
        Assert.Contains("410 customers", cut.Find("[data-testid=handover-off-7]").TextContent, StringComparison.Ordinal);
        Assert.Contains("A1: LB-A1-3 → LB-A1-4 (410 customers)", cut.Find("[data-testid=handover-off-7]").TextContent, StringComparison.Ordinal);
        Assert.Equal("4. close NO-A1-B1", cut.Find("[data-testid=handover-next-7]").TextContent);
        var questions = cut.Find("[data-testid=handover-questions-7]").TextContent;
        Assert.Contains("Unread indicators: FPI-A1-07, FPI-A1-08", questions, StringComparison.Ordinal);
        Assert.Contains("Distrusted readings: FPI-A1-04", questions, StringComparison.Ordinal);
        Assert.Contains("about 23,450", cut.Markup, StringComparison.Ordinal);
        Assert.Contains("Advice only", cut.Find("[data-testid=handover-7]").TextContent, StringComparison.Ordinal);
        Assert.Contains("incident 12", cut.Find("[data-testid=handover-not-loaded]").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void The_next_step_is_in_plain_words_with_its_ids_as_the_tooltip()
    {
        var incident = new HandoverIncident(9, "Marrowdell 20 kV", "isolated", 30, 120, [], "5. proveDead S104 S105", 0, "no interruption",
            [], [], [], null)
        {
            NextStepInWords = "5. prove dead section A1: LB-A1-3 → LB-A1-4",
        };
        var cut = Render<HandoverSheet>(p => p.Add(c => c.Document, new HandoverDocument(At, [incident], [])));

        var next = cut.Find("[data-testid=handover-next-9]");
        Assert.Equal("5. prove dead section A1: LB-A1-3 → LB-A1-4", next.TextContent);
        Assert.Equal("5. proveDead S104 S105", next.GetAttribute("title"));
    }

    [Fact]
    public void The_json_keeps_the_next_step_with_its_ids_and_leaves_the_words_to_the_page()
    {
        var incident = new HandoverIncident(9, "g", "isolated", 30, 120, [], "5. proveDead S104 S105", 0, "none", [], [], [], null)
        {
            NextStepInWords = "5. prove dead section A1: LB-A1-3 → LB-A1-4",
        };

        var json = System.Text.Json.JsonSerializer.Serialize(incident);

        Assert.Contains("5. proveDead S104 S105", json, StringComparison.Ordinal);
        Assert.DoesNotContain("prove dead", json, StringComparison.Ordinal);
    }

    [Fact]
    public void A_switch_whose_recorded_position_is_in_doubt_is_an_open_question()
    {
        var incident = new HandoverIncident(8, "Marrowdell 20 kV", "reported", 12, 0, [], null, 0, "no interruption",
            [], [], [], null)
        {
            SwitchSuspects = [new HandoverSwitchSuspect("NO-A1-B1", "closed", 0.82)],
        };
        var cut = Render<HandoverSheet>(p => p.Add(c => c.Document, new HandoverDocument(At, [incident], [])));

        Assert.Equal("Switch position in doubt: NO-A1-B1 probably closed (82 %), not as recorded",
            cut.Find("[data-testid=handover-switch-8-NO-A1-B1]").TextContent);
    }

    [Fact]
    public void With_no_open_incident_the_sheet_says_so()
    {
        var cut = Render<HandoverSheet>(p => p.Add(c => c.Document, new HandoverDocument(At, [], [])));

        Assert.Equal("No incident is open.", cut.Find("[data-testid=handover-none]").TextContent);
        Assert.Empty(cut.FindAll("article"));
    }
}
