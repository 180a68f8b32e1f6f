using DesignRules.Quantities;

namespace DesignRules.Tests.Quantities;

public sealed class EveryDimensionHasAHintOfAcceptedForms
{
    public static TheoryData<Dimension> Dimensions => new(Enum.GetValues<Dimension>());

    [Theory]
    [MemberData(nameof(Dimensions))]
    public void The_hint_names_the_dimension_and_its_examples_all_read_as_that_dimension(Dimension dimension)
    {
        string hint = QuantityForms.Example(dimension);
        Assert.Matches("^an? [a-z ]+ such as ", hint);
        string examples = hint[(hint.IndexOf(" such as ", StringComparison.Ordinal) + " such as ".Length)..];
        string[] forms = examples.Split([", ", " or "], StringSplitOptions.None);
        Assert.True(forms.Length >= 2, hint);
        foreach (string form in forms)
        {
            QuantityAssert.Parses(form, dimension);
        }
    }

    [Fact]
    public void The_resistance_and_voltage_hints_read_as_documented()
    {
        Assert.Equal("a resistance such as 4.7k, 4.7 kΩ, 4k7 or R47", QuantityForms.Example(Dimension.Resistance));
        Assert.Equal("a voltage such as 5 V, -12V or 250 mV", QuantityForms.Example(Dimension.Voltage));
    }
}
