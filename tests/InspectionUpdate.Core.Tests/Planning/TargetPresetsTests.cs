using System.Globalization;
using InspectionUpdate.Planning;

namespace InspectionUpdate.Tests.Planning;

public class TargetPresetsTests
{
    private static string DataFile(string name) => Path.Combine(AppContext.BaseDirectory, "data", "planning", name);

    public static TheoryData<string, int, double> JcssRows()
    {
        // Parsed from the verbatim table, not retyped.
        var data = new TheoryData<string, int, double>();
        foreach (var line in File.ReadAllLines(DataFile("jcss-pmc-part1-table1.csv")).Skip(1))
        {
            var cells = line.Split(',');
            for (var c = 1; c < cells.Length; c++)
            {
                data.Add(cells[0], c - 1, double.Parse(cells[c], CultureInfo.InvariantCulture));
            }
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(JcssRows))]
    [Reference("JCSS Probabilistic Model Code Part 1 (2001), §7, Table 1 (data/planning/jcss-pmc-part1-table1.csv)")]
    public void Jcss_presets_match_the_table(string costRow, int consequenceColumn, double beta)
    {
        var cost = Enum.Parse<RelativeCostOfSafetyMeasure>(costRow, ignoreCase: true);
        var consequence = (ConsequenceClass)consequenceColumn;
        var target = TargetPresets.Jcss(cost, consequence);
        Assert.Equal(beta, target.AnnualBeta, 1e-12);
        Assert.Equal(AnnualMeasure.Hazard, target.Measure);
        Assert.Contains("JCSS Probabilistic Model Code Part 1", target.Source, StringComparison.Ordinal);
        Assert.Contains("Table 1", target.Source, StringComparison.Ordinal);
        Assert.Contains(costRow, target.Source, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("Offshore pipeline design guidance, annual Pf by safety class (from memory; data/planning/offshore-pipeline-annual-pf.csv)")]
    public void Pipeline_presets_match_the_recalled_values_and_say_so()
    {
        foreach (var line in File.ReadAllLines(DataFile("offshore-pipeline-annual-pf.csv")).Skip(1))
        {
            var cells = line.Split(',');
            var target = TargetPresets.OffshorePipeline(Enum.Parse<PipelineSafetyClass>(cells[0], ignoreCase: true));
            Assert.Equal(double.Parse(cells[1], CultureInfo.InvariantCulture), target.AnnualPf, 1e-15);
            Assert.Contains("from memory", target.Source, StringComparison.Ordinal);
            Assert.Equal(AnnualMeasure.IntervalPf, target.Measure);
        }
    }

    [Fact]
    public void Every_preset_names_its_source_and_the_list_holds_twelve()
    {
        var all = TargetPresets.All();
        Assert.Equal(12, all.Count);
        Assert.All(all, t => Assert.False(string.IsNullOrWhiteSpace(t.Source)));
    }

    [Fact]
    public void Undefined_classes_are_rejected_with_their_parameter_name()
    {
        Assert.Equal("cost", Assert.Throws<ArgumentOutOfRangeException>(() => TargetPresets.Jcss((RelativeCostOfSafetyMeasure)9, ConsequenceClass.Minor)).ParamName);
        Assert.Equal("consequence", Assert.Throws<ArgumentOutOfRangeException>(() => TargetPresets.Jcss(RelativeCostOfSafetyMeasure.Normal, (ConsequenceClass)9)).ParamName);
        Assert.Equal("safetyClass", Assert.Throws<ArgumentOutOfRangeException>(() => TargetPresets.OffshorePipeline((PipelineSafetyClass)9)).ParamName);
    }
}
