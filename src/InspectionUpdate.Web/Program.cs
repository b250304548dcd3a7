using InspectionUpdate.Web;

// Standalone start (the usual start is `inspection-update serve`): --register FILE [--urls http://127.0.0.1:5080].
var app = WebView.Build(args);
app.Run();

/// <summary>The entry point (public for the in-process endpoint tests).</summary>
public partial class Program;
