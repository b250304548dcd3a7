namespace InspectionUpdate.Tests;

/// <summary>
/// Names the source of a test's expected values: a book with table or equation number, a paper and its example,
/// a closed form, or "independent computation in the test". Add "(from memory)" when a value was recalled rather
/// than read, and "common practice, no source" for a fact of the trade without a citable source.
/// </summary>
[AttributeUsage(AttributeTargets.Method | AttributeTargets.Class, AllowMultiple = true)]
public sealed class ReferenceAttribute(string source) : Attribute
{
    /// <summary>The source, as someone would look it up.</summary>
    public string Source { get; } = source;
}
