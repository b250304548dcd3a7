namespace InspectionUpdate.Degradation.Expressions;

/// <summary>An expression that does not parse or uses something it may not; names the position and the token.</summary>
public sealed class ExpressionParseException : ArgumentException
{
    /// <summary>Creates the exception.</summary>
    /// <param name="expression">The full expression text.</param>
    /// <param name="position">Zero-based character position of the problem.</param>
    /// <param name="token">The token found there (empty at the end of the text).</param>
    /// <param name="reason">What is wrong.</param>
    /// <param name="field">Which expression (e.g. "limitState" or "size"), used as the parameter name.</param>
    /// <param name="inner">The parser's exception, if any.</param>
    public ExpressionParseException(string expression, int position, string token, string reason, string field, Exception? inner = null)
        : base(Format(expression, position, token, reason, field), field, inner)
    {
        Expression = expression;
        Position = position;
        Token = token;
        Reason = reason;
    }

    /// <summary>The sentence, without .NET's "(Parameter '...')" suffix: it names the expression field itself.</summary>
    public override string Message => Format(Expression, Position, Token, Reason, ParamName ?? "expression");

    /// <summary>The expression text.</summary>
    public string Expression { get; }

    /// <summary>Zero-based character position of the problem.</summary>
    public int Position { get; }

    /// <summary>The token at <see cref="Position"/> ("" at the end of the text).</summary>
    public string Token { get; }

    /// <summary>What is wrong, without the position.</summary>
    public string Reason { get; }

    private static string Format(string expression, int position, string token, string reason, string field)
    {
        var where = token.Length == 0 ? "at the end of the expression" : $"at position {position} (token '{token}')";
        return $"Expression '{field}': {reason} {where}: {expression}";
    }
}
