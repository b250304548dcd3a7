using System.Globalization;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Unicode;
using InspectionUpdate.Reporting;
using Microsoft.AspNetCore.Antiforgery;

namespace InspectionUpdate.Web;

/// <summary>
/// Building blocks of the pages. Every value that comes from the register or a request goes through
/// <see cref="E"/> (HTML encoding); markup is only ever written from literals of this project.
/// </summary>
public static class Html
{
    // Encodes markup characters (< > & " ') and leaves letters of every script readable in the page source.
    private static readonly HtmlEncoder Encoder = HtmlEncoder.Create(UnicodeRanges.All);

    /// <summary>The encoded text of a value (null as empty).</summary>
    public static string E(object? value) => Encoder.Encode(value switch
    {
        null => string.Empty,
        IFormattable f => f.ToString(null, CultureInfo.InvariantCulture),
        _ => value.ToString() ?? string.Empty,
    });

    /// <summary>A URL path segment (encoded for the URL, then for the attribute).</summary>
    public static string Seg(string value) => E(Uri.EscapeDataString(value));

    /// <summary>A probability in the pages' notation (e.g. 3.2e-5), or a dash.</summary>
    public static string P(double? p) => p switch
    {
        null => "–",
        { } v when !double.IsFinite(v) => v.ToString(CultureInfo.InvariantCulture),
        0 => "0",
        { } v when v >= 0.01 => v.ToString("0.000", CultureInfo.InvariantCulture),
        { } v => v.ToString("0.0e+0", CultureInfo.InvariantCulture).Replace("e+", "e", StringComparison.Ordinal),
    };

    /// <summary>A number with a fixed format, or a dash.</summary>
    public static string N(double? v, string format = "0.##") => v is { } x && double.IsFinite(x) ? x.ToString(format, CultureInfo.InvariantCulture) : "–";

    /// <summary>An ISO 8601 date, or a dash.</summary>
    public static string D(DateOnly? d) => d?.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) ?? "–";

    /// <summary>The hidden anti-forgery field of a form.</summary>
    public static string Token(HttpContext context)
    {
        var antiforgery = context.RequestServices.GetRequiredService<IAntiforgery>();
        var tokens = antiforgery.GetAndStoreTokens(context);
        return $"<input type=\"hidden\" name=\"{E(tokens.FormFieldName)}\" value=\"{E(tokens.RequestToken)}\">";
    }

    /// <summary>A whole page: header with the register and the evidence date, the body, the cautions.</summary>
    public static string Page(HttpContext context, string title, string body, bool poll = false)
    {
        ArgumentNullException.ThrowIfNull(context);
        var holder = context.RequestServices.GetRequiredService<RegisterHolder>();
        var run = holder.Run;
        var b = new StringBuilder(body.Length + 4096);
        b.Append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">");
        b.Append("<title>").Append(E(title)).Append(" · InspectionUpdate</title><link rel=\"stylesheet\" href=\"/assets/site.css\">");
        if (poll) b.Append("<script src=\"/assets/poll.js\" defer></script>");
        b.Append("</head><body><header class=\"bar\"><a class=\"brand\" href=\"/\">InspectionUpdate</a><nav><a href=\"/\">Register</a><a href=\"/import\">Import findings</a></nav>");
        b.Append("<p class=\"context\">Register <code>").Append(E(Path.GetFileName(holder.Options.RegisterPath))).Append("</code> · evidence as of ")
            .Append(E(D(run.AsOf))).Append(" · target annual Pf ").Append(E(P(run.Target.AnnualPf))).Append(" · route ").Append(E(RouteName(holder.Options.Route))).Append("</p></header>");
        b.Append("<p class=\"caution\" role=\"note\">").Append(E(Cautions.Line)).Append("</p>");
        if (run.AsOf < DateOnly.FromDateTime(holder.Clock.GetUtcNow().UtcDateTime))
        {
            b.Append("<p class=\"caution\" role=\"note\">This view reads the register as recorded at the end of ").Append(E(D(run.AsOf)))
                .Append(" (as <code>register assess --as-of</code> does): findings written now are kept, and count in views as of today or later.</p>");
        }

        b.Append("<main>").Append(body).Append("</main>");
        b.Append("<footer><p>").Append(E(Cautions.Line)).Append("</p><p>Every number on these pages is computed by the same engine and register as the command line; ")
            .Append("the route, convergence and coefficient of variation are shown beside each. The demo scenario's data (sample-data) are invented.</p></footer></body></html>");
        return b.ToString();
    }

    /// <summary>The route option in words.</summary>
    public static string RouteName(InspectionUpdate.Updating.UpdatingRoute route) => route switch
    {
        InspectionUpdate.Updating.UpdatingRoute.FirstOrder => "first order",
        InspectionUpdate.Updating.UpdatingRoute.Simulation => "sample set",
        _ => "automatic (sample set, first order below its resolution and as a cross-check)",
    };

    /// <summary>The page's style sheet (served from code; no file is read).</summary>
    public const string Css = """
        :root { --ink:#1f2430; --muted:#5b6270; --line:#d9dce3; --band:#f3f1ec; --accent:#2a6f62; --warn:#9b2335; --amber:#8a5a00; }
        * { box-sizing: border-box; }
        body { margin:0; font: 15px/1.45 system-ui, -apple-system, "Segoe UI", sans-serif; color:var(--ink); background:#fbfaf7; }
        header.bar { background:var(--accent); color:#fff; padding:.6rem 1.2rem; display:flex; flex-wrap:wrap; gap:.4rem 1.4rem; align-items:baseline; }
        header.bar a { color:#fff; text-decoration:none; } header.bar .brand { font-weight:700; letter-spacing:.02em; }
        header.bar nav a { margin-right:1rem; } header.bar .context { margin:0; font-size:.85rem; opacity:.9; }
        .caution { margin:0; padding:.45rem 1.2rem; background:#fff4d6; border-bottom:1px solid #e8d9a8; font-size:.88rem; }
        main { padding:1rem 1.2rem 2rem; max-width:1200px; }
        footer { border-top:1px solid var(--line); padding:.8rem 1.2rem; color:var(--muted); font-size:.85rem; }
        h1 { font-size:1.35rem; margin:.3rem 0 .6rem; } h2 { font-size:1.1rem; margin:1.4rem 0 .5rem; border-bottom:1px solid var(--line); padding-bottom:.2rem; }
        table { border-collapse:collapse; width:100%; margin:.4rem 0 1rem; background:#fff; }
        th, td { border-bottom:1px solid var(--line); padding:.3rem .5rem; text-align:left; vertical-align:top; }
        th { background:var(--band); font-weight:600; } td.num { text-align:right; font-variant-numeric: tabular-nums; }
        th a { color:inherit; } tr.superseded td { color:var(--muted); }
        .flag { display:inline-block; padding:0 .4rem; margin:0 .15rem .1rem 0; border-radius:.6rem; font-size:.78rem; border:1px solid; }
        .flag.above { color:var(--warn); border-color:var(--warn); } .flag.overdue { color:#fff; background:var(--warn); border-color:var(--warn); }
        .flag.nc { color:var(--amber); border-color:var(--amber); } .flag.stale, .flag.none { color:var(--muted); border-color:var(--muted); }
        .filters a { margin-right:.6rem; } .filters a.on { font-weight:700; text-decoration:none; color:var(--ink); }
        dl.facts { display:grid; grid-template-columns:max-content 1fr; gap:.2rem 1rem; margin:.3rem 0 1rem; } dl.facts dt { color:var(--muted); } dl.facts dd { margin:0; }
        .box { border:1px solid var(--line); background:#fff; padding:.7rem .9rem; margin:.6rem 0 1rem; border-radius:4px; }
        .box.change { border-left:5px solid var(--accent); } .box.error { border-left:5px solid var(--warn); }
        .arrow { font-weight:700; padding:0 .3rem; }
        progress { width:18rem; height:1rem; vertical-align:middle; }
        form.entry { display:grid; grid-template-columns:max-content minmax(14rem, 28rem) 1fr; gap:.45rem .8rem; align-items:start; max-width:1100px; }
        form.entry label { padding-top:.25rem; font-weight:600; } form.entry .hint { color:var(--muted); font-size:.85rem; padding-top:.3rem; }
        form.entry .field-error { grid-column:3; color:var(--warn); font-weight:600; padding-top:.3rem; margin:0; }
        input[type=text], select, textarea { width:100%; padding:.3rem .4rem; font:inherit; border:1px solid #b8bdc8; border-radius:3px; }
        input[aria-invalid=true], select[aria-invalid=true] { border:2px solid var(--warn); }
        button { font:inherit; padding:.35rem .9rem; background:var(--accent); color:#fff; border:0; border-radius:3px; cursor:pointer; }
        button.quiet { background:#fff; color:var(--accent); border:1px solid var(--accent); }
        img.plot { max-width:100%; height:auto; border:1px solid var(--line); background:#fff; }
        .plots { display:grid; grid-template-columns:repeat(auto-fit, minmax(420px, 1fr)); gap:.8rem; }
        code { font-size:.92em; } .muted { color:var(--muted); }
        """;

    /// <summary>The polling script: asks the status URL of the element marked data-status every second, shows the fraction, reloads when the run ends.</summary>
    public const string PollScript = """
        (function () {
          var box = document.querySelector('[data-status]');
          if (!box) return;
          var bar = box.querySelector('progress'), text = box.querySelector('.pct');
          function tick() {
            fetch(box.getAttribute('data-status'), { headers: { 'Accept': 'application/json' }, cache: 'no-store' })
              .then(function (r) { return r.json(); })
              .then(function (s) {
                if (bar) bar.value = s.progress;
                if (text) text.textContent = Math.round(100 * s.progress) + ' %';
                if (s.state === 'done' || s.state === 'failed' || s.state === 'none') { window.location.reload(); return; }
                setTimeout(tick, 1000);
              })
              .catch(function () { setTimeout(tick, 3000); });
          }
          setTimeout(tick, 700);
        })();
        """;
}
