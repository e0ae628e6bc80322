using System.Text.RegularExpressions;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Switching;
using FeederLocate.Web.Naming;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Naming;

/// <summary>What the pages say: words, not the code's identifiers; numbers as people read them.</summary>
public partial class OperatorWordsTests
{
    [GeneratedRegex("[a-z][A-Z]|[A-Z][a-z]+[A-Z]")]
    private static partial Regex CodeCase();

    public static TheoryData<string, string> EveryActionWord()
    {
        var data = new TheoryData<string, string>();
        foreach (var action in Enum.GetValues<StepAction>())
        {
            data.Add(action.ToString(), OperatorWords.Action(action));
        }

        foreach (var type in Enum.GetValues<FaultType>())
        {
            data.Add(type.ToString(), OperatorWords.FaultType(type));
        }

        foreach (var quantity in new[] { "phaseCurrentA", "residualCurrentA", "neutralVoltageV" })
        {
            data.Add(quantity, OperatorWords.Quantity(quantity));
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(EveryActionWord))]
    public void Every_action_fault_type_and_quantity_is_shown_in_words(string identifier, string shown)
    {
        Assert.DoesNotMatch(CodeCase(), shown);
        Assert.NotEqual(identifier, shown);
    }

    [Fact]
    public void The_step_actions_read_as_an_operator_says_them()
    {
        Assert.Equal("prove dead", OperatorWords.Action(StepAction.ProveDead));
        Assert.Equal("remove the earths from", OperatorWords.Action(StepAction.RemoveEarth));
    }

    [Theory]
    [InlineData(0, "none")]
    [InlineData(0.4, "under 1")]
    [InlineData(22_491.6, "about 22,492")]
    public void An_estimate_is_never_about_zero(double value, string shown) => Assert.Equal(shown, OperatorWords.Estimate(value));

    [Theory]
    [InlineData(1234.4, "1,234")]
    [InlineData(56.73, "56.7")]
    [InlineData(3.456, "3.46")]
    public void A_measured_value_has_sensible_digits(double value, string shown) => Assert.Equal(shown, OperatorWords.Measured(value));

    [Theory]
    [InlineData(1234.5, "1,230")]
    [InlineData(0.0456, "0.0456")]
    [InlineData(12.34, "12.3")]
    public void A_prior_strength_has_three_significant_digits_and_no_exponent(double value, string shown) => Assert.Equal(shown, OperatorWords.Figure(value));

    [Theory]
    [InlineData(0.045, 1, "4.5 %")]
    [InlineData(0.2, 0, "20 %")]
    public void A_share_is_a_percentage_with_a_space_before_the_sign(double share, int decimals, string shown) =>
        Assert.Equal(shown, OperatorWords.Percent(share, decimals));

    [Theory]
    [InlineData(0.25, "0.25 Ω")]
    [InlineData(4.55, "4.6 Ω")]
    [InlineData(349.6, "350 Ω")]
    [InlineData(1200, "1.2 kΩ")]
    [InlineData(2960, "3 kΩ")]
    [InlineData(12_400, "12 kΩ")]
    public void A_fault_resistance_is_given_in_ohms_or_kilohms(double ohm, string shown) => Assert.Equal(shown, OperatorWords.Resistance(ohm));

    [Fact]
    public void Section_and_segment_ids_in_a_text_become_names_but_an_id_inside_a_device_name_stays()
    {
        var grid = LoadedGrids.Sample("solid");
        var section = grid.SectionNames[new FeederLocate.Core.Model.SectionId("SEC-S101")];
        var segment = grid.SegmentNames[new FeederLocate.Core.Model.SegmentId("S102")];

        var shown = OperatorWords.WithNames("patrol SEC-S101 and S102. Read FPI-S102 (S102).", grid.SectionNames, grid.SegmentNames);

        Assert.Equal($"patrol {section} and {segment}. Read FPI-S102 ({segment}).", shown);
    }
}
