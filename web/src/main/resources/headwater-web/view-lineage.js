// The lineage graph around one dataset: upstream left, downstream right, grown node by node from
// /api/datasets/{id}/lineage. Options live in the address (columns, from/to of a highlighted path,
// evidence kinds, minimum confidence) so a view can be bookmarked and shared.
"use strict";

hw.views.lineage = async function (main, route) {
  const centre = Number(route.parts[1]);
  const params = route.params;
  const EVIDENCE = ["static", "runtime", "declared", "inferred"];
  const DEPTH = 2; // steps opened around the centre when the address says nothing
  const state = {
    columns: params.get("columns") === "1",
    evidence: new Set((params.get("evidence") || EVIDENCE.join(",")).split(",").filter((e) => EVIDENCE.includes(e))),
    min: Math.min(1, Math.max(0, Number(params.get("min") || 0))),
    from: params.get("from") ? Number(params.get("from")) : null,
    to: params.get("to") ? Number(params.get("to")) : null,
    depth: params.get("depth") ? Math.max(0, Math.min(50, Math.floor(Number(params.get("depth")) || 0))) : DEPTH,
    selected: null,
  };
  const known = new Map(); // id -> {id, name, kind, report, expanded}
  const byName = new Map();
  const edges = new Map(); // edge id -> edge

  const title = hw.el("h1", "Lineage");
  const status = hw.el("p", "Loading\u2026", "quiet");
  status.setAttribute("role", "status");
  status.id = "graph-status";
  const canvas = hw.el("div", null, "canvas");
  const picture = document.createElementNS("http://www.w3.org/2000/svg", "svg");
  picture.setAttribute("class", "graph");
  picture.setAttribute("role", "group");
  picture.setAttribute("aria-label", "Lineage graph; Tab moves between datasets, arrow keys follow the layers, Enter shows details, E expands or collapses, O opens the page");
  canvas.append(picture);
  const side = hw.el("aside", null, "node-panel");
  side.id = "node-panel";

  const columnsBox = checkbox("Show columns", state.columns, (on) => { state.columns = on; refresh(true); });
  columnsBox.querySelector("input").id = "show-columns";
  const evidenceBoxes = EVIDENCE.map((ev) => checkbox(ev, state.evidence.has(ev), (on) => {
    if (on) state.evidence.add(ev); else state.evidence.delete(ev);
    refresh(false);
  }, "ev-sample ev-" + ev));
  const slider = hw.el("input");
  Object.assign(slider, { type: "range", min: "0", max: "1", step: "0.05", value: String(state.min) });
  slider.setAttribute("aria-label", "Lowest confidence shown");
  const sliderValue = hw.el("output", state.min.toFixed(2));
  slider.addEventListener("input", () => { state.min = Number(slider.value); sliderValue.textContent = state.min.toFixed(2); refresh(false); });
  const steps = hw.el("select");
  steps.id = "open-steps";
  steps.setAttribute("aria-label", "Steps opened around the centre");
  for (const n of [...new Set([1, 2, 3, 5, 10, 20, state.depth])].sort((a, b) => a - b)) {
    const o = hw.el("option", String(n));
    o.value = String(n);
    o.selected = n === state.depth;
    steps.append(o);
  }
  // A new depth is a new starting picture: a new address, which the router draws afresh.
  steps.addEventListener("change", () => {
    const next = new URLSearchParams(params);
    if (Number(steps.value) === DEPTH) next.delete("depth"); else next.set("depth", steps.value);
    location.hash = "#/lineage/" + centre + (next.toString() ? "?" + next : "");
  });
  const pathNote = hw.el("p", null, "path-note");
  pathNote.id = "path-note";
  const tools = hw.h("div", "tools",
    hw.h("fieldset", null, hw.el("legend", "Level"), columnsBox),
    hw.h("fieldset", null, hw.el("legend", "Steps open"), hw.h("label", null, steps)),
    hw.h("fieldset", "legend", hw.el("legend", "Evidence (line style)"), ...evidenceBoxes),
    hw.h("fieldset", null, hw.el("legend", "Lowest confidence"), hw.h("label", null, slider, " ", sliderValue)),
    pathNote);
  main.append(hw.h("section", "panel", title, status, tools), hw.h("div", "graph-area", canvas, side));

  function checkbox(label, on, change, sampleClass) {
    const input = hw.el("input");
    input.type = "checkbox";
    input.checked = on;
    input.addEventListener("change", () => change(input.checked));
    const l = hw.h("label", "check", input, " ");
    if (sampleClass) {
      const s = document.createElementNS("http://www.w3.org/2000/svg", "svg");
      s.setAttribute("width", "34"); s.setAttribute("height", "10");
      const line = document.createElementNS("http://www.w3.org/2000/svg", "line");
      for (const [k, v] of Object.entries({ x1: 1, y1: 5, x2: 33, y2: 5, class: "edge " + sampleClass.replace("ev-sample ", "") })) line.setAttribute(k, v);
      s.append(line);
      l.append(s, " ");
    }
    l.append(label);
    return l;
  }

  async function report(id) {
    const n = known.get(id);
    if (n && n.report) return n.report;
    return accept(id, await hw.get("/api/datasets/" + id + "/lineage"));
  }

  function accept(id, r) {
    const node = note(id, r.dataset);
    node.report = r;
    for (const e of r.upstream) { note(e.dataset_id, e.dataset_name); addEdge(e, e.dataset_id, id); }
    for (const e of r.downstream) { note(e.dataset_id, e.dataset_name); addEdge(e, id, e.dataset_id); }
    return r;
  }

  function note(id, name) {
    if (!known.has(id)) known.set(id, { id, name, kind: kinds.get(id) || "file", report: null, expanded: false });
    byName.set(name, id);
    return known.get(id);
  }

  function addEdge(e, from, to) {
    edges.set(e.edge_id, { key: e.edge_id, from, to, evidence: e.evidence, confidence: e.combined_confidence ?? e.confidence, script: e.script });
  }

  async function expand(id, on) {
    const n = known.get(id);
    if (on) await report(id);
    n.expanded = on;
  }

  function passing() {
    return [...edges.values()].filter((e) => state.evidence.has(e.evidence) && e.confidence + 1e-9 >= state.min);
  }

  /** Visible: the centre, and every neighbour (through passing edges) of a visible expanded node. */
  function visible() {
    const ok = passing();
    const seen = new Set([centre]);
    const queue = [centre];
    for (let i = 0; i < queue.length; i++) {
      const u = queue[i];
      if (!known.get(u) || !known.get(u).expanded) continue;
      for (const e of ok) {
        const v = e.from === u ? e.to : e.to === u ? e.from : null;
        if (v !== null && !seen.has(v)) { seen.add(v); queue.push(v); }
      }
    }
    return { ids: seen, edges: ok.filter((e) => seen.has(e.from) && seen.has(e.to)) };
  }

  let drawn = new Map();
  let placed = null;

  async function refresh(needColumns) {
    const next = new URLSearchParams();
    if (state.columns) next.set("columns", "1");
    if (state.evidence.size !== EVIDENCE.length) next.set("evidence", [...state.evidence].join(","));
    if (state.min > 0) next.set("min", String(state.min));
    if (state.from !== null) next.set("from", String(state.from));
    if (state.to !== null) next.set("to", String(state.to));
    if (state.depth !== DEPTH) next.set("depth", String(state.depth));
    hw.replaceParams(next);
    let v = visible();
    if (state.columns && needColumns) {
      status.textContent = "Reading columns\u2026";
      await Promise.all([...v.ids].map((id) => report(id).catch(() => null)));
      v = visible();
    }
    const nodes = [...v.ids].map((id) => {
      const n = known.get(id);
      const r = n.report;
      return { id, name: n.name, kind: n.kind, expanded: n.expanded,
        expandable: !r || r.upstream.length + r.downstream.length > 0,
        columns: r ? r.columns.map((c) => c.name) : null };
    });
    const columnEdges = [];
    const used = new Set();
    if (state.columns) {
      for (const id of v.ids) {
        const r = known.get(id).report;
        if (!r) continue;
        const influencing = new Set();
        for (const c of r.columns) {
          for (const o of c.origins) {
            const from = byName.get(o.dataset);
            if (from === undefined || !v.ids.has(from)) continue;
            columnEdges.push({ from, fromColumn: o.column, to: id, toColumn: c.name, derived: o.derived });
            used.add(from + "\u0000" + o.column); used.add(id + "\u0000" + c.name);
          }
          for (const f of c.influencing) influencing.add(f.dataset + "\u0000" + f.column);
        }
        for (const key of influencing) {
          const [dataset, column] = key.split("\u0000");
          const from = byName.get(dataset);
          if (from === undefined || !v.ids.has(from)) continue;
          columnEdges.push({ from, fromColumn: column, to: id, toColumn: null, influencing: true });
        }
      }
    }
    let highlight = { nodes: new Set(), edges: new Set() };
    pathNote.replaceChildren();
    if (state.from !== null && state.to !== null) {
      const p = hwGraph.path(v.edges, state.from, state.to);
      const names = [nameOf(state.from), nameOf(state.to)];
      if (p) highlight = p;
      pathNote.append(p ? "Path between " + names[0] + " and " + names[1] + ": " + p.nodes.size + " datasets." : "No path between " + names[0] + " and " + names[1] + " with these filters.");
      pathNote.append(" ", button("Clear path", () => { state.from = state.to = null; refresh(false); }));
    } else if (state.from !== null) {
      pathNote.append("Path from " + nameOf(state.from) + ": now choose \u201cpath to here\u201d on another dataset (or Shift+click it).");
    }
    const graph = { center: centre, nodes, edges: v.edges, columnEdges, columnLevel: state.columns, highlight, selected: state.selected, usedColumns: used,
      byId: new Map(nodes.map((n) => [n.id, n])) };
    placed = hwGraph.layout(graph);
    drawn = hwGraph.draw(picture, graph, placed, hw.kindSigns);
    status.textContent = nodes.length + (nodes.length === 1 ? " dataset, " : " datasets, ") + v.edges.length + (v.edges.length === 1 ? " link" : " links") + (state.columns ? ", " + columnEdges.length + " column links" : "") + ". Upstream is on the left.";
    if (state.selected !== null) panel(state.selected);
    if (focusAfter !== null && drawn.get(focusAfter)) { drawn.get(focusAfter).focus(); focusAfter = null; }
  }

  function nameOf(id) {
    return known.has(id) ? known.get(id).name : "#" + id;
  }

  function button(label, action) {
    const b = hw.el("button", label);
    b.type = "button";
    b.addEventListener("click", action);
    return b;
  }

  async function toggle(id) {
    focusAfter = id;
    await expand(id, !known.get(id).expanded);
    await refresh(true);
  }

  function panel(id) {
    const n = known.get(id);
    if (!n) return;
    side.replaceChildren();
    const list = (items) => hw.h("ul", "plain", ...items);
    const ins = [...edges.values()].filter((e) => e.to === id);
    const outs = [...edges.values()].filter((e) => e.from === id);
    const edgeItem = (e, other) => hw.h("li", null, hw.link(hw.datasetHref(other), nameOf(other)),
      hw.el("span", " " + e.evidence + " " + e.confidence.toFixed(2), "quiet"), e.script ? hw.h("span", null, " via ", hw.link(hw.scriptByName(e.script), e.script)) : null);
    side.append(hw.h("div", null, hw.kindBadge(n.kind)), hw.el("h2", n.name),
      hw.h("p", "actions", hw.link(hw.datasetHref(id), "Open its page", "button open"),
        button(n.expanded ? "Collapse" : "Expand", () => toggle(id)),
        id !== centre ? hw.link("#/lineage/" + id + (state.columns ? "?columns=1" : ""), "Centre here", "button") : null,
        button("Path from here", () => { state.from = id; state.to = null; refresh(false); }),
        state.from !== null && state.from !== id ? button("Path to here", () => { state.to = id; refresh(false); }) : null),
      n.report ? hw.h("div", null, hw.el("h3", "Comes from"), ins.length ? list(ins.map((e) => edgeItem(e, e.from))) : hw.el("p", "Nothing known.", "quiet"),
        hw.el("h3", "Goes into"), outs.length ? list(outs.map((e) => edgeItem(e, e.to))) : hw.el("p", "Nothing known.", "quiet"))
        : hw.el("p", "Expand it to read its links.", "quiet"));
  }

  let focusAfter = null;
  picture.addEventListener("click", (event) => {
    const t = event.target.closest("[data-toggle]");
    if (t) { toggle(Number(t.dataset.toggle)); return; }
    const g = event.target.closest(".node");
    if (!g) return;
    const id = Number(g.dataset.id);
    if (event.shiftKey) {
      if (state.from === null || state.to !== null) { state.from = id; state.to = null; } else state.to = id;
    }
    state.selected = id;
    refresh(false);
  });
  picture.addEventListener("dblclick", (event) => {
    const g = event.target.closest(".node");
    if (g) location.hash = hw.datasetHref(g.dataset.id);
  });
  picture.addEventListener("keydown", (event) => {
    const g = event.target.closest(".node");
    if (!g || !placed) return;
    const id = Number(g.dataset.id);
    const here = placed.pos.get(id);
    const move = (target) => { if (target !== undefined && drawn.get(target)) { drawn.get(target).focus(); event.preventDefault(); } };
    const key = event.key;
    if (key === "Enter") { state.selected = id; focusAfter = id; refresh(false); event.preventDefault(); }
    else if (key === "e" || key === "E" || key === " " || key === "+" || key === "-") { toggle(id); event.preventDefault(); }
    else if (key === "o" || key === "O") location.hash = hw.datasetHref(id);
    else if (key === "ArrowUp" || key === "ArrowDown") {
      const column = placed.layers.get(here.layer);
      move(column[column.indexOf(id) + (key === "ArrowUp" ? -1 : 1)]);
    } else if (key === "ArrowLeft" || key === "ArrowRight") {
      const at = placed.keys.indexOf(here.layer) + (key === "ArrowLeft" ? -1 : 1);
      const column = placed.layers.get(placed.keys[at]);
      if (!column) return;
      let best, dist = Infinity;
      for (const other of column) {
        const d = Math.abs(placed.pos.get(other).y - here.y);
        if (d < dist) { dist = d; best = other; }
      }
      move(best);
    }
  });

  const kinds = new Map();
  try {
    // the starting picture in one answer: every dataset within the steps asked for, with its links
    const around = await hw.get("/api/ui/lineage/" + centre + "?depth=" + state.depth);
    for (const [id, kind] of Object.entries(around.kinds)) kinds.set(Number(id), kind);
    for (const b of around.datasets) accept(b.id, b.report);
    for (const b of around.datasets) if (b.distance < state.depth || b.id === centre) known.get(b.id).expanded = true;
  } catch (e) {
    status.textContent = e.message;
    return;
  }
  title.replaceChildren("Lineage of ", hw.link(hw.datasetHref(centre), nameOf(centre)));
  document.title = "Lineage of " + nameOf(centre) + " · Headwater";
  await refresh(true);
};
