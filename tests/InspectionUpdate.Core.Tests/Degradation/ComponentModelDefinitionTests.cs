using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Degradation.Definition;
using InspectionUpdate.Degradation.Expressions;
using InspectionUpdate.Degradation.Fatigue;

namespace InspectionUpdate.Tests.Degradation;

public class ComponentModelDefinitionTests
{
    private static string RepoFile(params string[] parts)
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "InspectionUpdate.sln"))) dir = dir.Parent;
        Assert.NotNull(dir);
        return File.ReadAllText(Path.Combine([dir!.FullName, .. parts]));
    }

    public static TheoryData<string> SampleFiles => new(
        "sandwick-injection-line-external-corrosion.json",
        "sandwick-injection-line-leak-expression.json",
        "hollin-reef-brace-joint-crack-growth.json",
        "hollin-reef-brace-joint-two-stage.json",
        "hollin-reef-brace-joint-sn-fatigue.json");

    [Theory]
    [MemberData(nameof(SampleFiles))]
    public void Sample_models_parse_validate_and_build(string file)
    {
        var result = ComponentModelDefinition.Parse(RepoFile("sample-data", "models", file));
        Assert.True(result.IsValid, result.Describe());
        var model = result.Definition!.Build();
        var x = model.Inputs.Variables.Select(v => v.Mean).ToArray();
        Assert.True(double.IsFinite(model.Margin(x, 10)));
        Assert.False(string.IsNullOrWhiteSpace(model.Name));
    }

    [Fact]
    public void Corrosion_sample_builds_the_burst_model_with_its_settings()
    {
        var d = ComponentModelDefinition.Parse(RepoFile("sample-data", "models", "sandwick-injection-line-external-corrosion.json")).Definition!;
        Assert.Equal(MechanismKind.Corrosion, d.Mechanism);
        Assert.Equal(30, d.ServiceLifeYears);
        var m = Assert.IsType<CorrosionModel>(d.Build());
        Assert.Equal(CorrosionFailureMode.BurstDnvRpF101, m.Settings.FailureMode);
        Assert.True(m.Settings.LengthGrows);
        Assert.Equal(323.9, m.Inputs.Variables[m.Inputs.IndexOf("diameter_mm")].Mean);
        Assert.True(m.Inputs.Variables[m.Inputs.IndexOf("diameter_mm")].IsDeterministic);
    }

    [Fact]
    [Reference("JCSS PMC Part 3 two-stage constants in air (read): C1 mean 4.80e-18 CoV 1.70, m1 5.10, C2 5.86e-13 CoV 0.60, m2 2.88")]
    public void Crack_growth_preset_fills_the_law_constants()
    {
        var d = ComponentModelDefinition.Parse(RepoFile("sample-data", "models", "hollin-reef-brace-joint-two-stage.json")).Definition!;
        Assert.Equal("jcss-two-stage-air", d.CrackGrowthPreset);
        var m = Assert.IsType<CrackGrowthModel>(d.Build());
        Assert.Equal(CrackGrowthLaw.TwoStage, m.Settings.Law);
        Assert.False(m.Settings.Geometry.IsConstant);
        var c1 = m.Inputs.Variables[m.Inputs.IndexOf("parisC1")];
        Assert.Equal(4.80e-18, c1.Mean, 1e-30);
        Assert.Equal(1.70, c1.CoefficientOfVariation, 1e-12);
        Assert.Equal(2.88, m.Inputs.Variables[m.Inputs.IndexOf("parisM2")].Mean);
    }

    [Fact]
    public void Expression_sample_equals_the_same_expression_built_by_hand()
    {
        var d = ComponentModelDefinition.Parse(RepoFile("sample-data", "models", "sandwick-injection-line-leak-expression.json")).Definition!;
        var m = Assert.IsType<ExpressionModel>(d.Build());
        double[] x = [12.7, 6, 0.7, 0.8];
        Assert.Equal(0.8 * 12.7 - 0.7 * Math.Pow(14, 0.8), m.Margin(x, 20), 1e-12);
        Assert.Equal(["initiationTime_years"], m.RenewedOnRepair);
        Assert.Equal(12.7, m.MaximumSizeMm);
    }

    [Fact]
    public void Every_problem_of_a_bad_file_is_listed_with_its_path()
    {
        var result = ComponentModelDefinition.Parse(RepoFile("tests", "InspectionUpdate.Core.Tests", "data", "degradation", "bad-model-many-problems.json"));
        Assert.False(result.IsValid);
        Assert.Null(result.Definition);
        var paths = result.Problems.Select(p => p.Path).ToList();
        string[] expected =
        [
            "$.name", "$.serviceLife_years", "$.colour", "$.mechanism.growthLaw", "$.mechanism.leakFraction",
            "$.inputs.wallThickness_mm.sd", "$.inputs.rate_mmPerYear", "$.inputs.diameter_mm",
            "$.inputs.tensileStrength_MPa.family", "$.inputs.corrosionRate", "$.correlations[0].between", "$.correlations[1].rho",
        ];
        foreach (var e in expected) Assert.Contains(e, paths);
        // Missing required inputs are named.
        Assert.Contains(result.Problems, p => p.Path == "$.inputs" && p.Message.Contains("'defectLength_mm'"));
        // Values are quoted as written.
        Assert.Contains(result.Problems, p => p.Path == "$.mechanism.growthLaw" && p.Value == "\"cubic\"" && p.Message.Contains("linear, powerLaw"));
        Assert.Contains(result.Problems, p => p.Path == "$.inputs.wallThickness_mm.sd" && p.Value == "-0.2");
        Assert.True(result.Problems.Count >= expected.Length);
    }

    [Fact]
    public void Invalid_json_reports_the_line()
    {
        var result = ComponentModelDefinition.Parse("{ \"name\": \"x\", \n \"inputs\": { ] }");
        var p = Assert.Single(result.Problems);
        Assert.Contains("line 2", p.Message);
    }

    [Fact]
    public void Bad_expression_in_a_file_names_its_position_and_token()
    {
        const string json = """
            {
              "schemaVersion": 1, "name": "x", "serviceLife_years": 10,
              "mechanism": { "type": "expression", "limitState": "R - S * factr" },
              "inputs": { "R": { "family": "Normal", "mean": 10, "sd": 1 }, "S": 5 }
            }
            """;
        var result = ComponentModelDefinition.Parse(json);
        var p = Assert.Single(result.Problems);
        Assert.Equal("$.mechanism.limitState", p.Path);
        Assert.Contains("token 'factr'", p.Message);
        Assert.Contains("position 8", p.Message);
    }

    [Fact]
    public void Correlations_build_into_the_stochastic_model()
    {
        const string json = """
            {
              "schemaVersion": 1, "name": "corr", "serviceLife_years": 10,
              "mechanism": { "type": "expression", "limitState": "R - S" },
              "inputs": { "R": { "family": "Normal", "mean": 10, "sd": 1 }, "S": { "family": "Normal", "mean": 5, "cov": 0.2 } },
              "correlations": [ { "between": ["R", "S"], "rho": 0.4 } ]
            }
            """;
        var result = ComponentModelDefinition.Parse(json);
        Assert.True(result.IsValid, result.Describe());
        var m = result.Definition!.Build();
        Assert.Equal(0.4, m.Inputs.Correlation![0, 1]);
        Assert.Equal(1.0, m.Inputs.Variables[1].StandardDeviation, 1e-12);
    }

    [Fact]
    public void Changing_one_input_parameter_derives_a_variant()
    {
        var d = ComponentModelDefinition.Parse(RepoFile("sample-data", "models", "hollin-reef-brace-joint-crack-growth.json")).Definition!;
        var v = d.WithInputParameter("weibullScale_MPa", "mean", 7.5);
        Assert.Equal(7.5, v.Build().Inputs.Variables.Single(x => x.Name == "weibullScale_MPa").Mean, 1e-12);
        Assert.Equal(6.5, d.Build().Inputs.Variables.Single(x => x.Name == "weibullScale_MPa").Mean, 1e-12);
        Assert.Throws<ArgumentException>(() => d.WithInputParameter("nope", "mean", 1));
    }
}
