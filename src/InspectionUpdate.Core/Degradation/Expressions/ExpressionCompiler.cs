using System.Linq.Expressions;
using System.Text.RegularExpressions;
using DynamicExpresso;
using DynamicExpresso.Exceptions;

namespace InspectionUpdate.Degradation.Expressions;

/// <summary>A compiled expression f(x, t) over named inputs and time.</summary>
/// <param name="x">Physical inputs, in the order of the names given to the compiler.</param>
/// <param name="timeYears">Time t in years.</param>
public delegate double CompiledExpression(double[] x, double timeYears);

/// <summary>
/// Compiles arithmetic expressions over named inputs and the time t (years) into delegates with DynamicExpresso:
/// C# operator syntax, numbers as doubles (so 1/2 is 0.5), the functions exp, ln, log10, sqrt, pow, abs, min, max,
/// sin, cos, tan, atan, sinh, cosh, tanh, phi (standard normal CDF) and the constant pi. No assignment, no
/// member access, no types: only arithmetic, comparisons and the conditional operator.
/// </summary>
public static partial class ExpressionCompiler
{
    /// <summary>Name of the time variable in expressions.</summary>
    public const string TimeName = "t";

    private static readonly (string Name, Delegate Function)[] Functions =
    [
        ("exp", (Func<double, double>)Math.Exp),
        ("ln", (Func<double, double>)Math.Log),
        ("log10", (Func<double, double>)Math.Log10),
        ("sqrt", (Func<double, double>)Math.Sqrt),
        ("pow", (Func<double, double, double>)Math.Pow),
        ("abs", (Func<double, double>)Math.Abs),
        ("min", (Func<double, double, double>)Math.Min),
        ("max", (Func<double, double, double>)Math.Max),
        ("sin", (Func<double, double>)Math.Sin),
        ("cos", (Func<double, double>)Math.Cos),
        ("tan", (Func<double, double>)Math.Tan),
        ("atan", (Func<double, double>)Math.Atan),
        ("sinh", (Func<double, double>)Math.Sinh),
        ("cosh", (Func<double, double>)Math.Cosh),
        ("tanh", (Func<double, double>)Math.Tanh),
        ("phi", (Func<double, double>)Probability.StandardNormal.Cdf),
    ];

    /// <summary>The longest expression accepted, in characters (a bound on the parser's and compiler's work).</summary>
    public const int MaximumLength = 2000;

    /// <summary>The deepest nesting of brackets accepted (the parser recurses once per level).</summary>
    public const int MaximumNesting = 32;

    /// <summary>Reserved words that may not be input names.</summary>
    public static IReadOnlyCollection<string> ReservedNames { get; } =
        Functions.Select(f => f.Name).Concat([TimeName, "pi", "true", "false", "null"]).ToHashSet(StringComparer.Ordinal);

    /// <summary>Compiles <paramref name="expression"/> over <paramref name="inputNames"/> and t.</summary>
    /// <param name="expression">The text, e.g. "0.8*wallThickness_mm - rate_mmPerYear*max(0, t - initiationTime_years)".</param>
    /// <param name="inputNames">Input names in the order of x.</param>
    /// <param name="field">Which expression this is, for messages (e.g. "limitState").</param>
    /// <exception cref="ExpressionParseException">The text does not parse, names an unknown identifier, or is not numeric; the message gives the position and the token.</exception>
    /// <exception cref="ArgumentException">An input name is not a valid identifier or is reserved.</exception>
    public static CompiledExpression Compile(string expression, IReadOnlyList<string> inputNames, string field = "expression")
    {
        ArgumentNullException.ThrowIfNull(inputNames);
        if (string.IsNullOrWhiteSpace(expression))
        {
            throw new ExpressionParseException(expression ?? "", 0, "", "the expression is empty", field);
        }

        CheckBounds(expression, field);
        foreach (var name in inputNames)
        {
            if (!IdentifierPattern().IsMatch(name))
            {
                throw new ArgumentException($"Input name '{name}' cannot be used in an expression: use letters, digits and underscores, starting with a letter or underscore.", nameof(inputNames));
            }

            if (ReservedNames.Contains(name))
            {
                throw new ArgumentException($"Input name '{name}' is reserved in expressions (time, a function or a constant).", nameof(inputNames));
            }
        }

        var interpreter = new Interpreter(InterpreterOptions.PrimitiveTypes | InterpreterOptions.SystemKeywords)
            .SetDefaultNumberType(DefaultNumberType.Double)
            .EnableAssignment(AssignmentOperators.None)
            .SetVariable("pi", Math.PI);
        foreach (var (name, function) in Functions) interpreter.SetFunction(name, function);

        var parameters = inputNames.Select(n => new Parameter(n, typeof(double))).Append(new Parameter(TimeName, typeof(double))).ToArray();
        Lambda lambda;
        try
        {
            lambda = interpreter.Parse(expression, parameters);
        }
        catch (UnknownIdentifierException e)
        {
            throw new ExpressionParseException(expression, e.Position, TokenAt(expression, e.Position),
                $"unknown name '{e.Identifier}' (known: {string.Join(", ", inputNames.Append(TimeName))}; functions: {string.Join(", ", Functions.Select(f => f.Name))})", field, e);
        }
        catch (ParseException e)
        {
            throw new ExpressionParseException(expression, e.Position, TokenAt(expression, e.Position), FirstSentence(e.Message), field, e);
        }
        catch (DynamicExpressoException e)
        {
            throw new ExpressionParseException(expression, 0, TokenAt(expression, 0), FirstSentence(e.Message), field, e);
        }
        catch (InvalidOperationException e)
        {
            // Operator type mismatches (e.g. a comparison used as a number) surface from the expression-tree builder.
            throw new ExpressionParseException(expression, 0, TokenAt(expression, 0), e.Message, field, e);
        }

        var body = lambda.Expression;
        if (body.Type == typeof(bool))
        {
            throw new ExpressionParseException(expression, 0, TokenAt(expression, 0),
                "the expression is a condition (true/false), not a number; write the margin, e.g. 'capacity - demand'", field);
        }

        if (!IsNumeric(body.Type))
        {
            throw new ExpressionParseException(expression, 0, TokenAt(expression, 0), $"the expression has type {body.Type.Name}, not a number", field);
        }

        var x = Expression.Parameter(typeof(double[]), "x");
        var t = Expression.Parameter(typeof(double), "t");
        var map = new Dictionary<ParameterExpression, Expression>();
        for (var i = 0; i < inputNames.Count; i++) map[parameters[i].Expression] = Expression.ArrayIndex(x, Expression.Constant(i));
        map[parameters[^1].Expression] = t;
        var rewritten = new ParameterRewriter(map).Visit(body);
        if (rewritten.Type != typeof(double)) rewritten = Expression.Convert(rewritten, typeof(double));
        return Expression.Lambda<CompiledExpression>(rewritten, x, t).Compile();
    }

    /// <summary>
    /// Refuses, before parsing, what would make the recursive parser run out of stack: text longer than
    /// <see cref="MaximumLength"/>, brackets nested deeper than <see cref="MaximumNesting"/>, unbalanced brackets
    /// (with the position of the first unmatched one), and more than three signs in a row.
    /// </summary>
    private static void CheckBounds(string expression, string field)
    {
        if (expression.Length > MaximumLength)
        {
            throw new ExpressionParseException(expression[..40] + "…", 0, TokenAt(expression, 0), $"the expression has {expression.Length} characters; at most {MaximumLength} are accepted", field);
        }

        var depth = 0;
        var open = new Stack<int>();
        var signs = 0;
        for (var i = 0; i < expression.Length; i++)
        {
            var c = expression[i];
            if (char.IsWhiteSpace(c)) continue;
            signs = c is '-' or '+' or '!' ? signs + 1 : 0;
            if (signs > 3) throw new ExpressionParseException(expression, i, c.ToString(), "more than three signs in a row", field);
            if (c == '(')
            {
                open.Push(i);
                if (++depth > MaximumNesting) throw new ExpressionParseException(expression, i, "(", $"brackets nested deeper than {MaximumNesting} levels", field);
            }
            else if (c == ')')
            {
                if (depth == 0) throw new ExpressionParseException(expression, i, ")", "a closing bracket without an opening one", field);
                depth--;
                open.Pop();
            }
        }

        if (open.Count > 0) throw new ExpressionParseException(expression, open.Peek(), "(", "an opening bracket is never closed", field);
    }

    /// <summary>Names used by an expression that are inputs (for validation messages).</summary>
    public static IReadOnlyList<string> InputsUsed(string expression, IReadOnlyList<string> inputNames)
    {
        var words = IdentifierWords().Matches(expression).Select(m => m.Value).ToHashSet(StringComparer.Ordinal);
        return inputNames.Where(words.Contains).ToArray();
    }

    private static bool IsNumeric(Type type) =>
        type == typeof(double) || type == typeof(float) || type == typeof(int) || type == typeof(long) || type == typeof(decimal) || type == typeof(short);

    private static string FirstSentence(string message)
    {
        // DynamicExpresso appends " (at index N)." to its messages; the position is reported separately.
        var i = message.IndexOf(" (at index", StringComparison.Ordinal);
        return (i > 0 ? message[..i] : message).TrimEnd('.');
    }

    private static string TokenAt(string expression, int position)
    {
        if (position < 0 || position >= expression.Length) return "";
        var m = TokenPattern().Match(expression, position);
        return m.Success && m.Index == position ? m.Value : expression[position].ToString();
    }

    [GeneratedRegex(@"^[A-Za-z_][A-Za-z0-9_]*$")]
    private static partial Regex IdentifierPattern();

    [GeneratedRegex(@"[A-Za-z_][A-Za-z0-9_]*")]
    private static partial Regex IdentifierWords();

    [GeneratedRegex(@"[A-Za-z_][A-Za-z0-9_]*|\d+(\.\d*)?([eE][+-]?\d+)?|\.\d+|&&|\|\||[<>=!]=|\S")]
    private static partial Regex TokenPattern();

    private sealed class ParameterRewriter(Dictionary<ParameterExpression, Expression> map) : ExpressionVisitor
    {
        protected override Expression VisitParameter(ParameterExpression node) => map.TryGetValue(node, out var e) ? e : node;
    }
}
