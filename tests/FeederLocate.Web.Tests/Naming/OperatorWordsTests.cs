using System.Text.RegularExpressions;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Switching;
using FeederLocate.Web.Naming;

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
}
