using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Infrastructure;

/// <summary>
/// A small registrar for Spectre.Console.Cli: commands are built by their widest public constructor from
/// registered instances (the <see cref="CliHost"/>); requests for IEnumerable&lt;T&gt; get every registration of T.
/// </summary>
internal sealed class TypeRegistrar : ITypeRegistrar
{
    private readonly Dictionary<Type, List<Func<object>>> _factories = [];

    public void Register(Type service, Type implementation) => Add(service, () => Create(implementation));

    public void RegisterInstance(Type service, object implementation) => Add(service, () => implementation);

    public void RegisterLazy(Type service, Func<object> factory)
    {
        var lazy = new Lazy<object>(factory);
        Add(service, () => lazy.Value);
    }

    public ITypeResolver Build() => new Resolver(this);

    private void Add(Type service, Func<object> factory)
    {
        if (!_factories.TryGetValue(service, out var list)) _factories[service] = list = [];
        list.Add(factory);
    }

    private object? TryResolve(Type type)
    {
        if (_factories.TryGetValue(type, out var list) && list.Count > 0) return list[^1]();
        if (type.IsGenericType && type.GetGenericTypeDefinition() == typeof(IEnumerable<>))
        {
            var element = type.GetGenericArguments()[0];
            var found = _factories.TryGetValue(element, out var all) ? all.Select(f => f()).ToArray() : [];
            var array = Array.CreateInstance(element, found.Length);
            for (var i = 0; i < found.Length; i++) array.SetValue(found[i], i);
            return array;
        }

        if (type.IsAbstract || type.IsInterface) return null;
        return Create(type);
    }

    private object Create(Type type)
    {
        var ctor = type.GetConstructors().OrderByDescending(c => c.GetParameters().Length).First();
        var args = ctor.GetParameters().Select(p => TryResolve(p.ParameterType)
            ?? throw new InvalidOperationException($"Cannot build {p.ParameterType.Name} for {type.Name}.")).ToArray();
        return ctor.Invoke(args);
    }

    private sealed class Resolver(TypeRegistrar owner) : ITypeResolver
    {
        public object? Resolve(Type? type) => type is null ? null : owner.TryResolve(type);
    }
}
