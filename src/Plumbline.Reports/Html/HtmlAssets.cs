namespace Plumbline.Reports.Html;

/// <summary>The page's inline style, legend and script: kept here so the page needs nothing from outside.</summary>
internal static class HtmlAssets
{
    /// <summary>A calm paper-and-ink look: warm off-white page, slate text, one plum accent; status colours that also differ in lightness.</summary>
    public const string Style = """
        :root { --paper: #fbf9f4; --ink: #1f2633; --muted: #5f6877; --rule: #ddd6c8; --plum: #6a3d73;
                --settled: #2e7a58; --overturned: #a85a12; --contested: #6d4fa3; --failed: #b13a30;
                --true: #dcefe6; --false: #f6e0d9; --pruned: #eeece7; }
        * { box-sizing: border-box; }
        body { margin: 0 auto; max-width: 1180px; padding: 24px 28px 60px; background: var(--paper); color: var(--ink);
               font: 15px/1.5 system-ui, -apple-system, "Segoe UI", sans-serif; }
        h1 { font-size: 26px; margin: 0; letter-spacing: .01em; }
        h1 .mark { color: var(--plum); }
        h2 { font-size: 18px; margin: 32px 0 10px; border-bottom: 2px solid var(--rule); padding-bottom: 4px; }
        h3 { font-size: 16px; margin: 0 0 4px; }
        h4 { font-size: 14px; margin: 10px 0 4px; color: var(--muted); }
        code { font-size: 13px; background: #f0ece2; padding: 1px 4px; border-radius: 4px; }
        .meta { color: var(--muted); margin: 6px 0 0; }
        .caution { margin: 18px 0; padding: 12px 16px; border-left: 5px solid var(--plum); background: #f3edf4; border-radius: 6px; }
        .cards { display: grid; grid-template-columns: repeat(auto-fill, minmax(170px, 1fr)); gap: 10px; margin: 0; }
        .cards div { background: #fff; border: 1px solid var(--rule); border-radius: 10px; padding: 10px 12px; }
        .cards dt { color: var(--muted); font-size: 12px; text-transform: uppercase; letter-spacing: .06em; }
        .cards dd { margin: 2px 0 0; font-size: 22px; font-weight: 600; }
        .cards small { color: var(--muted); }
        table { border-collapse: collapse; width: 100%; background: #fff; }
        th, td { text-align: left; padding: 6px 8px; border-bottom: 1px solid var(--rule); vertical-align: top; }
        th { font-size: 12px; text-transform: uppercase; letter-spacing: .05em; color: var(--muted); }
        tr.fail td { color: var(--failed); font-weight: 600; }
        .filters { display: flex; flex-wrap: wrap; gap: 8px; align-items: center; margin: 0 0 10px; }
        .filters input[type=search] { flex: 1 1 260px; padding: 7px 10px; border: 1px solid var(--rule); border-radius: 8px; font: inherit; }
        .chip { border: 1px solid var(--rule); border-radius: 999px; padding: 3px 10px; background: #fff; cursor: pointer; }
        .shown { color: var(--muted); margin-left: auto; }
        .status { display: inline-block; padding: 0 8px; border-radius: 999px; color: #fff; font-size: 12px; font-weight: 600; }
        .status.settled, .chip.settled input { background: var(--settled); accent-color: var(--settled); }
        .status.overturned, .chip.overturned input { background: var(--overturned); accent-color: var(--overturned); }
        .status.contested, .chip.contested input { background: var(--contested); accent-color: var(--contested); }
        .status.failed, .chip.failed input { background: var(--failed); accent-color: var(--failed); }
        .claim { background: #fff; border: 1px solid var(--rule); border-radius: 12px; padding: 14px 16px; margin: 14px 0; overflow-x: auto; }
        .claim .id { font-family: ui-monospace, monospace; color: var(--muted); }
        .verdict { margin: 0 0 8px; }
        .reason { color: var(--failed); }
        .legend { display: flex; flex-wrap: wrap; gap: 16px; color: var(--muted); font-size: 13px; margin-bottom: 6px; }
        .legend span::before { content: ""; display: inline-block; width: 14px; height: 10px; margin-right: 5px; border: 1px solid #9aa3b0; vertical-align: middle; }
        .legend .l-true::before { background: var(--true); } .legend .l-false::before { background: var(--false); }
        .legend .l-pruned::before { background: var(--pruned); border-style: dashed; }
        .legend .l-entail::before { border: 0; border-top: 2px solid var(--settled); height: 0; }
        .legend .l-contra::before { border: 0; border-top: 2px dashed var(--failed); height: 0; }
        svg.tree { display: block; max-width: none; }
        svg.tree .edge { stroke: #b8b2a5; stroke-width: 1.5; }
        svg.tree .link { fill: none; stroke-width: 1.6; opacity: .85; }
        svg.tree .link.entailment { stroke: var(--settled); }
        svg.tree .link.contradiction { stroke: var(--failed); stroke-dasharray: 5 4; }
        svg.tree .node rect { stroke: #8d96a3; stroke-width: 1.2; fill: #fff; }
        svg.tree .node.held-true rect { fill: var(--true); }
        svg.tree .node.held-false rect { fill: var(--false); }
        svg.tree .node.pruned rect { fill: var(--pruned); stroke-dasharray: 4 3; }
        svg.tree .node.pruned text { fill: var(--muted); }
        svg.tree text { font-size: 12px; fill: var(--ink); }
        svg.tree text.head { font-weight: 600; font-size: 11.5px; }
        .pairs td { font-size: 13px; }
        .no-tree { color: var(--muted); font-style: italic; }

        """;

    /// <summary>The legend above the trees, with the arrow marker every tree's entailment curves point with.</summary>
    public const string Legend = """
        <div class="legend" aria-label="Legend"><span class="l-true">held true in the optimum</span><span class="l-false">held false</span><span class="l-pruned">pruned</span><span class="l-entail">entailment (arrow: premise to hypothesis)</span><span class="l-contra">contradiction</span></div>
        <svg width="0" height="0" style="position:absolute" aria-hidden="true"><defs><marker id="arrow" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" markerHeight="7" orient="auto-start-reverse"><path d="M0,0 L10,5 L0,10 z" fill="#2e7a58"/></marker></defs></svg>

        """;

    /// <summary>Filters the claim table and the trees together by status and by text in id, claim or tags.</summary>
    public const string Script = """
        (function () {
          var text = document.getElementById('filter-text');
          var boxes = Array.prototype.slice.call(document.querySelectorAll('input[data-status-filter]'));
          var shown = document.getElementById('shown');
          function apply() {
            var wanted = text.value.trim().toLowerCase();
            var on = {};
            boxes.forEach(function (box) { on[box.getAttribute('data-status-filter')] = box.checked; });
            var rows = 0;
            document.querySelectorAll('[data-claim]').forEach(function (el) {
              var visible = on[el.getAttribute('data-status')] === true &&
                (wanted === '' || el.getAttribute('data-search').indexOf(wanted) >= 0);
              el.hidden = !visible;
              if (visible && el.tagName === 'TR') { rows++; }
            });
            shown.textContent = String(rows);
          }
          text.addEventListener('input', apply);
          boxes.forEach(function (box) { box.addEventListener('change', apply); });
          apply();
        })();

        """;
}
