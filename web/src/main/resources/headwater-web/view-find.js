// Find: results as the user types, facets from the server when it sends them, and for a newcomer who has
// not typed yet, an overview of what the catalog holds.
"use strict";

hw.views.find = function (main, route) {
  const params = route.params;
  const input = hw.el("input");
  Object.assign(input, { type: "search", id: "q", autocomplete: "off", value: params.get("q") || "",
    placeholder: "words of a name, a column, a tag or a description" });
  input.setAttribute("aria-label", "Search the catalog");
  const form = hw.h("form", "find", input);
  form.setAttribute("role", "search");
  const facets = hw.el("aside", null, "facets");
  const hits = hw.el("ol", null, "hits");
  hits.id = "hits";
  const summary = hw.el("p", null, "quiet");
  summary.id = "summary";
  const results = hw.h("section", "panel results", summary, hits);
  const help = hw.el("div");
  help.id = "welcome";
  main.append(hw.h("section", "panel", hw.el("h1", "Find data"), form), help, hw.h("div", "with-side", facets, results));

  let ticket = 0;
  let timer = null;
  const chosen = {}; // facet name -> value
  if (params.get("kind")) chosen.kind = params.get("kind");

  async function welcome() {
    help.replaceChildren();
    let o;
    try {
      o = await hw.get("/api/ui/overview");
    } catch (e) {
      help.append(hw.el("p", "The catalog did not answer: " + e.message, "notice"));
      return;
    }
    const kinds = hw.el("ul", null, "chips");
    for (const [kind, n] of Object.entries(o.kinds)) {
      const chip = hw.link("#/?kind=" + encodeURIComponent(kind), "");
      chip.append(hw.kindBadge(kind), " " + n);
      kinds.append(hw.h("li", null, chip));
    }
    const list = (items, note) => {
      const ul = hw.el("ul", null, "plain");
      for (const d of items) {
        ul.append(hw.h("li", null, hw.kindBadge(d.kind), hw.link(hw.datasetHref(d.id), d.name), hw.el("span", " " + note(d), "quiet")));
      }
      if (!items.length) ul.append(hw.el("li", "Nothing yet.", "quiet"));
      return ul;
    };
    help.append(hw.h("section", "panel welcome",
      hw.el("h2", "What this catalog holds"),
      hw.el("p", o.datasets + " datasets and " + o.scripts + " scripts, harvested from folders and read from code and runs."),
      kinds,
      hw.h("div", "two",
        hw.h("div", null, hw.el("h3", "Used the most"), list(o.most_used, (d) => "read by " + d.uses + (d.uses === 1 ? " step" : " steps"))),
        hw.h("div", null, hw.el("h3", "Changed lately"), list(o.recent, (d) => hw.when(d.modified_at)))),
      hw.el("p", "Type a few letters above: results appear as you type. Words match names, columns, tags and descriptions; a dataset page shows where it comes from and what uses it.", "quiet")));
  }

  function facetBlock(name, counts) {
    const entries = Object.entries(counts || {});
    if (!entries.length) return null;
    const box = hw.h("fieldset", "facet", hw.el("legend", name));
    for (const [value, n] of entries) {
      const b = hw.el("button", null, "facet-value" + (chosen[name] === value ? " on" : ""));
      b.type = "button";
      b.append(hw.el("span", value), hw.el("span", String(n), "count"));
      b.setAttribute("aria-pressed", chosen[name] === value ? "true" : "false");
      b.addEventListener("click", () => {
        if (chosen[name] === value) delete chosen[name]; else chosen[name] = value;
        run();
      });
      box.append(b);
    }
    return box;
  }

  function localFacets(list) {
    const kind = {}, format = {};
    for (const h of list) {
      kind[h.kind] = (kind[h.kind] || 0) + 1;
      if (h.format) format[h.format] = (format[h.format] || 0) + 1;
    }
    return { kind, format };
  }

  async function run() {
    const text = input.value.trim();
    const mine = ++ticket;
    const next = new URLSearchParams();
    if (text) next.set("q", text);
    for (const [k, v] of Object.entries(chosen)) next.set(k, v);
    hw.replaceParams(next);
    if (!text && chosen.kind) {
      help.hidden = true;
      results.hidden = false;
      const page = await hw.get("/api/datasets?limit=500&kind=" + encodeURIComponent(chosen.kind)).catch((e) => ({ items: [], error: e.message }));
      if (mine !== ticket) return;
      facets.replaceChildren();
      summary.textContent = page.error || (page.total + " datasets of kind " + chosen.kind.replace("_", " "));
      hits.replaceChildren(...page.items.map((d) => hw.h("li", "hit", hw.kindBadge(d.kind), hw.link(hw.datasetHref(d.id), d.name, "hit-name"),
        d.format ? hw.el("span", d.format, "quiet fmt") : null)));
      return;
    }
    if (!text) {
      hits.replaceChildren();
      facets.replaceChildren();
      summary.textContent = "";
      results.hidden = true;
      help.hidden = false;
      return;
    }
    help.hidden = true;
    results.hidden = false;
    const q = new URLSearchParams({ q: text, limit: "50", size: "50" });
    for (const [k, v] of Object.entries(chosen)) q.set(k, v);
    let answer;
    try {
      answer = await hw.get("/api/search?" + q.toString());
    } catch (e) {
      if (mine !== ticket) return;
      summary.textContent = e.message;
      hits.replaceChildren();
      return;
    }
    if (mine !== ticket) return; // a newer keystroke asked already
    // Older servers do not filter by facets other than kind: filter here so the chosen facet is honoured.
    let list = answer.hits;
    if (!answer.facets) list = list.filter((h) => Object.entries(chosen).every(([k, v]) => h[k] === v));
    const total = answer.total !== undefined && answer.facets ? answer.total : list.length;
    // Beyond the server's count cap the total is an estimate; say so rather than show a false exact figure.
    const about = answer.exact === false ? "about " + total.toLocaleString("en") : total;
    summary.textContent = total ? about + (total === 1 ? " match" : " matches") + " for \u201c" + text + "\u201d" : "Nothing matches \u201c" + text + "\u201d.";
    if (!total && answer.suggestion) {
      const s = hw.link("#/?q=" + encodeURIComponent(answer.suggestion), answer.suggestion);
      summary.append(" Did you mean ", s, "?");
    }
    hits.replaceChildren();
    for (const hit of list) {
      const href = hit.kind === "script" ? "#/script/" + encodeURIComponent(hit.id) : hw.datasetHref(hit.id);
      const item = hw.h("li", "hit", hw.kindBadge(hit.kind), hw.link(href, hit.name, "hit-name"));
      if (hit.format) item.append(hw.el("span", hit.format, "quiet fmt"));
      if (hit.snippet) {
        // The only server text put in as HTML: the search endpoint escapes it and adds <mark> itself.
        const p = hw.el("p", null, "snippet");
        p.innerHTML = hit.snippet;
        item.append(p);
      } else {
        item.append(highlighted(hit.name, text));
      }
      hits.append(item);
    }
    facets.replaceChildren();
    const counts = answer.facets || localFacets(answer.hits);
    for (const [name, values] of Object.entries(counts)) {
      const block = facetBlock(name, values);
      if (block) facets.append(block);
    }
  }

  /** Marks the typed words inside a name, built from text nodes (no HTML). */
  function highlighted(name, text) {
    const words = text.toLowerCase().split(/[^\p{L}\p{N}]+/u).filter((w) => w.length > 1);
    const p = hw.el("p", null, "snippet");
    const lower = name.toLowerCase();
    let at = 0;
    while (at < name.length) {
      let best = -1, len = 0;
      for (const w of words) {
        const i = lower.indexOf(w, at);
        if (i >= 0 && (best < 0 || i < best)) { best = i; len = w.length; }
      }
      if (best < 0) break;
      p.append(name.slice(at, best), hw.el("mark", name.slice(best, best + len)));
      at = best + len;
    }
    p.append(name.slice(at));
    return p;
  }

  input.addEventListener("input", () => {
    clearTimeout(timer);
    timer = setTimeout(run, 120);
  });
  form.addEventListener("submit", (e) => { e.preventDefault(); run(); });
  welcome();
  if (input.value || chosen.kind) run(); else results.hidden = true;
  input.focus();
  return () => clearTimeout(timer);
};
