using System.Globalization;
using InspectionUpdate.Application;
using InspectionUpdate.Register;
using Microsoft.AspNetCore.Antiforgery;
using Microsoft.AspNetCore.DataProtection;
using Microsoft.AspNetCore.Http.Features;

namespace InspectionUpdate.Web;

/// <summary>Builds the web view: services, security headers, and the endpoints of every page.</summary>
public static class WebView
{
    /// <summary>Largest CSV upload accepted (bytes).</summary>
    public const long MaxUploadBytes = 10 * 1024 * 1024;

    /// <summary>
    /// Builds the application. With <paramref name="options"/> null, the options are read from configuration
    /// (<c>--WebView:Register FILE</c> or <c>--register FILE</c>); <paramref name="urls"/> sets the addresses to listen on.
    /// </summary>
    public static WebApplication Build(string[] args, WebViewOptions? options = null, IReadOnlyList<string>? urls = null, TimeProvider? clock = null)
    {
        var builder = WebApplication.CreateSlimBuilder(new WebApplicationOptions { Args = args, ContentRootPath = AppContext.BaseDirectory });
        if (urls is not null) builder.WebHost.UseUrls([.. urls]);
        else if (builder.Configuration["urls"] is null) builder.WebHost.UseUrls("http://127.0.0.1:5080");
        builder.WebHost.ConfigureKestrel(k => k.Limits.MaxRequestBodySize = MaxUploadBytes + 64 * 1024);
        builder.Logging.SetMinimumLevel(LogLevel.Warning);
        AddServices(builder.Services, options, clock);
        var app = builder.Build();
        MapEndpoints(app);
        return app;
    }

    /// <summary>The services of the view.</summary>
    public static void AddServices(IServiceCollection services, WebViewOptions? options, TimeProvider? clock)
    {
        if (options is not null) services.AddSingleton(options);
        else services.AddSingleton(sp => WebViewOptions.From(sp.GetRequiredService<IConfiguration>()));
        services.AddSingleton(clock ?? TimeProvider.System);
        services.AddSingleton<RegisterHolder>();
        services.AddSingleton<ResultCache>();
        services.AddSingleton<IRecorderIdentity, OperatingSystemUser>();
        services.AddSingleton<BackgroundRuns>();
        services.AddHostedService(sp => sp.GetRequiredService<BackgroundRuns>());
        // Keys of the anti-forgery tokens live in memory only: nothing is written to disk, and a restart asks for a reload.
        services.AddDataProtection().UseEphemeralDataProtectionProvider();
        services.AddAntiforgery(o =>
        {
            o.Cookie.Name = "iu-antiforgery";
            o.Cookie.SameSite = SameSiteMode.Strict;
            o.FormFieldName = "__iu_token";
        });
        services.Configure<FormOptions>(o => o.MultipartBodyLengthLimit = MaxUploadBytes);
    }

    /// <summary>Maps the pages and the status endpoints.</summary>
    public static void MapEndpoints(WebApplication app)
    {
        ArgumentNullException.ThrowIfNull(app);
        app.Use(async (context, next) =>
        {
            var h = context.Response.Headers;
            // Nothing outside the view is ever loaded: styles and script come from the view itself, plots are inline images.
            h.ContentSecurityPolicy = "default-src 'none'; style-src 'self'; script-src 'self'; img-src data:; connect-src 'self'; form-action 'self'; frame-ancestors 'none'; base-uri 'none'";
            h.XContentTypeOptions = "nosniff";
            h.XFrameOptions = "DENY";
            h["Referrer-Policy"] = "no-referrer";
            try
            {
                await next(context);
            }
            catch (ApplicationFailureException e) when (!context.Response.HasStarted)
            {
                await Problem(context, e.Kind == FailureKind.BadInput ? StatusCodes.Status404NotFound : StatusCodes.Status503ServiceUnavailable, e.FullText);
            }
            catch (AntiforgeryValidationException) when (!context.Response.HasStarted)
            {
                await Problem(context, StatusCodes.Status400BadRequest, "The form's anti-forgery token is missing or invalid: nothing was written. Reload the page and submit again.");
            }
        });

        app.MapGet("/assets/site.css", () => Results.Text(Html.Css, "text/css; charset=utf-8"));
        app.MapGet("/assets/poll.js", () => Results.Text(Html.PollScript, "text/javascript; charset=utf-8"));

        app.MapGet("/", (HttpContext context, RegisterHolder register, BackgroundRuns queue, string? site, string? sort, string? dir, string? job) =>
        {
            var data = RegisterOverview.Read(register.Store, register.Run);
            var shown = (job is null ? null : queue.Find(job)) ?? queue.Active(BackgroundRuns.RegisterSubject);
            return HtmlResult(RegisterPage.Render(context, data, site, sort, dir == "desc", shown));
        });

        app.MapPost("/register/assess", async (HttpContext context, BackgroundRuns queue) =>
        {
            await Validate(context);
            var job = queue.WholeRegister();
            return Results.Redirect("/?job=" + Uri.EscapeDataString(job.Id));
        });

        app.MapGet("/jobs/{id}", (string id, BackgroundRuns queue) =>
        {
            var job = queue.Find(id);
            return Results.Json(new JobStatusDocument(job?.Id ?? id, job?.Subject, job is null ? "none" : State(job.State), job?.Progress ?? 0, job?.Error, job?.Note));
        });

        app.MapGet("/components/{code}", (HttpContext context, string code, RegisterHolder register, ResultCache cache, BackgroundRuns queue) =>
            HtmlResult(ComponentPage.Render(context, View(code, register, cache, queue))));

        app.MapGet("/components/{code}/findings/new", (HttpContext context, string code, RegisterHolder register) =>
        {
            var records = ComponentRecordsReader.Read(register.Store, code);
            return HtmlResult(FindingFormPage.Log(context, records, new FindingInput(code, null, FindingEntries.Text(FindingKind.NoIndication), null), []));
        });

        app.MapPost("/components/{code}/findings", async (HttpContext context, string code, RegisterHolder register, ResultCache cache, IRecorderIdentity who) =>
        {
            var form = await Validate(context);
            var records = ComponentRecordsReader.Read(register.Store, code);
            var input = Input(records.Component.Code, form);
            var before = Before(code, register, cache);
            var written = FindingEntries.Log(register.Store, input, who.Name(context));
            if (!written.Succeeded) return HtmlResult(FindingFormPage.Log(context, records, input, written.Problems), StatusCodes.Status422UnprocessableEntity);
            var f = written.Stored!;
            cache.Changed(code, new ComponentChange($"Finding F-{f.FindingId.ToString(CultureInfo.InvariantCulture)} logged: {FindingWords.Of(f.Kind)} on {Html.D(f.InspectionDate)}", register.Clock.GetUtcNow(), before));
            return Results.Redirect("/components/" + Uri.EscapeDataString(code), permanent: false, preserveMethod: false);
        });

        app.MapGet("/findings/{id:long}/correct", (HttpContext context, long id, RegisterHolder register) =>
        {
            var (finding, records) = Finding(register, id);
            return HtmlResult(FindingFormPage.Correct(context, finding, records, FindingInput.From(finding.Current), null, [], null, []));
        });

        app.MapPost("/findings/{id:long}/correct", async (HttpContext context, long id, RegisterHolder register, ResultCache cache, IRecorderIdentity who) =>
        {
            var form = await Validate(context);
            var (finding, records) = Finding(register, id);
            var input = Input(finding.Current.ComponentCode, form);
            var reason = form["reason"].ToString();
            var code = finding.Current.ComponentCode;
            var before = Before(code, register, cache);
            var written = FindingEntries.Correct(register.Store, id, input, who.Name(context), reason);
            if (!written.Succeeded) return HtmlResult(FindingFormPage.Correct(context, finding, records, input, reason, written.Problems, null, []), StatusCodes.Status422UnprocessableEntity);
            cache.Changed(code, new ComponentChange($"Finding F-{id.ToString(CultureInfo.InvariantCulture)} corrected (revision {written.Stored!.Revision.ToString(CultureInfo.InvariantCulture)}): {reason.Trim()}",
                register.Clock.GetUtcNow(), before));
            return Results.Redirect("/components/" + Uri.EscapeDataString(code));
        });

        app.MapPost("/findings/{id:long}/withdraw", async (HttpContext context, long id, RegisterHolder register, ResultCache cache, IRecorderIdentity who) =>
        {
            var form = await Validate(context);
            var (finding, records) = Finding(register, id);
            var reason = form["reason"].ToString();
            var code = finding.Current.ComponentCode;
            var before = Before(code, register, cache);
            var written = FindingEntries.Withdraw(register.Store, id, who.Name(context), reason);
            if (!written.Succeeded)
            {
                return HtmlResult(FindingFormPage.Correct(context, finding, records, FindingInput.From(finding.Current), null, [], reason, written.Problems), StatusCodes.Status422UnprocessableEntity);
            }

            cache.Changed(code, new ComponentChange($"Finding F-{id.ToString(CultureInfo.InvariantCulture)} withdrawn: {reason.Trim()}", register.Clock.GetUtcNow(), before));
            return Results.Redirect("/components/" + Uri.EscapeDataString(code));
        });

        app.MapGet("/import", (HttpContext context) => HtmlResult(ImportPage.Render(context, null, null, null)));

        app.MapPost("/import", async (HttpContext context, RegisterHolder register, ResultCache cache, IRecorderIdentity who) =>
        {
            var form = await Validate(context);
            var file = form.Files.GetFile("file");
            if (file is null || file.Length == 0) return HtmlResult(ImportPage.Render(context, null, null, "Choose a CSV file first."), StatusCodes.Status422UnprocessableEntity);
            // The uploaded name is a label only (shown and recorded with the batch); nothing is read from or written to a path.
            var name = SafeName(file.FileName);
            using var reader = new StreamReader(file.OpenReadStream(), System.Text.Encoding.UTF8, detectEncodingFromByteOrderMarks: true);
            var result = FindingEntries.Import(register.Store, reader, name, who.Name(context));
            if (!result.Succeeded) return HtmlResult(ImportPage.Render(context, result, name, null), StatusCodes.Status422UnprocessableEntity);
            foreach (var group in result.Findings.GroupBy(f => f.ComponentCode, StringComparer.Ordinal))
            {
                cache.Changed(group.Key, new ComponentChange($"{group.Count().ToString(CultureInfo.InvariantCulture)} finding(s) imported from {name} (batch {result.ImportBatchId!.Value.ToString(CultureInfo.InvariantCulture)})",
                    register.Clock.GetUtcNow(), Before(group.Key, register, cache)));
            }

            return HtmlResult(ImportPage.Render(context, result, name, null));
        });
    }

    /// <summary>The status of a background run, as the polling script reads it.</summary>
    public sealed record JobStatusDocument(string Id, string? Subject, string State, double Progress, string? Error, string? Note);

    private static string State(JobState s) => s switch
    {
        JobState.Queued => "queued",
        JobState.Running => "running",
        JobState.Done => "done",
        _ => "failed",
    };

    private static ComponentView View(string code, RegisterHolder register, ResultCache cache, BackgroundRuns queue)
    {
        var store = register.Store;
        var run = register.Run;
        var records = ComponentRecordsReader.Read(store, code);
        ComponentContext? context = null;
        string? error = null;
        string? key = null;
        try
        {
            context = ComponentContexts.FromRegister(store, records.Component, run.AsOf);
            key = ComponentRefresh.Key(store, records.Component.Code, run);
        }
        catch (ApplicationFailureException e)
        {
            error = e.FullText;
        }

        var cached = cache.Latest(records.Component.Code);
        var current = key is not null && cached?.Result.Key == key ? cached : null;
        Job? job = null;
        if (current is null && key is not null && context is not null && records.Component.InstallDate <= run.AsOf)
        {
            job = queue.Failed(records.Component.Code, key) ?? queue.Component(records.Component.Code, key);
        }

        return new ComponentView(records, context, error, current, job, cache.LastChange(records.Component.Code));
    }

    private static (FindingRecord Finding, ComponentRecords Records) Finding(RegisterHolder register, long id)
    {
        var current = ComponentRecordsReader.Finding(register.Store, id)
            ?? throw ApplicationFailureException.BadInput("finding", id.ToString(CultureInfo.InvariantCulture), "is not in the register.");
        var records = ComponentRecordsReader.Read(register.Store, current.ComponentCode);
        return (records.Findings.First(f => f.FindingId == id), records);
    }

    private static ResultSummary? Before(string code, RegisterHolder register, ResultCache cache)
    {
        if (cache.Latest(code) is { } cached) return ResultSummary.Of(cached.Result);
        return ComponentRefresh.Stored(register.Store, code, register.Run) is { } stored ? ResultSummary.Of(stored) : null;
    }

    private static FindingInput Input(string code, IFormCollection form) => new(code, form["inspection_date"], form["kind"], form["method"],
        form["measured_size_mm"], form["remaining_wall_mm"], form["location"], form["note"]);

    private static async Task<IFormCollection> Validate(HttpContext context)
    {
        var antiforgery = context.RequestServices.GetRequiredService<IAntiforgery>();
        await antiforgery.ValidateRequestAsync(context);
        return await context.Request.ReadFormAsync();
    }

    /// <summary>A file name reduced to a label: no folders, no control characters, at most 100 characters.</summary>
    internal static string SafeName(string? name)
    {
        var last = (name ?? string.Empty).Replace('\\', '/').Split('/')[^1];
        var clean = new string(last.Where(ch => !char.IsControl(ch)).ToArray()).Trim();
        return clean.Length == 0 ? "upload.csv" : clean.Length > 100 ? clean[..100] : clean;
    }

    private static IResult HtmlResult(string html, int status = StatusCodes.Status200OK) => Results.Content(html, "text/html; charset=utf-8", System.Text.Encoding.UTF8, status);

    private static async Task Problem(HttpContext context, int status, string message)
    {
        context.Response.StatusCode = status;
        context.Response.ContentType = "text/html; charset=utf-8";
        string page;
        try
        {
            page = Html.Page(context, "Problem", $"<h1>{(status == 404 ? "Not found" : "Problem")}</h1><div class=\"box error\" id=\"problems\">{Html.E(message)}</div><p><a href=\"/\">Back to the register</a></p>");
        }
        catch (ApplicationFailureException)
        {
            page = "<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>Problem</title></head><body><p>" + Html.E(message) + "</p></body></html>";
        }

        await context.Response.WriteAsync(page);
    }
}
