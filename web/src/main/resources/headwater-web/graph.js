// Layered left-to-right layout and SVG drawing of a lineage graph, written for Headwater (no library):
// layers are signed distances from the centre (upstream negative, downstream positive), the order within
// a layer is improved by a few barycentre sweeps to cut crossings, and nodes are stacked per layer.
// Pure functions of the data handed in, so the lineage view and the render benchmark share them.
"use strict";

const hwGraph = (function () {
  const SVG = "http://www.w3.org/2000/svg";
  const NODE_W = 230, HEAD_H = 34, ROW_H = 18, GAP_X = 110, GAP_Y = 16, MAX_ROWS = 40, PAD = 24;

  function svg(tag, attrs, text) {
    const node = document.createElementNS(SVG, tag);
    for (const k in attrs) node.setAttribute(k, attrs[k]);
    if (text !== undefined) node.textContent = text;
    return node;
  }

  function rowsOf(node, columnLevel) {
    if (!columnLevel || !node.columns) return 0;
    return Math.min(node.columns.length, MAX_ROWS) + (node.columns.length > MAX_ROWS ? 1 : 0);
  }

  /** Positions for every node: {pos: Map id -> {x, y, w, h, layer}, width, height}. */
  function layout(graph) {
    const out = new Map(), into = new Map();
    for (const n of graph.nodes) { out.set(n.id, []); into.set(n.id, []); }
    for (const e of graph.edges) {
      if (out.has(e.from) && into.has(e.to)) { out.get(e.from).push(e.to); into.get(e.to).push(e.from); }
    }
    const layer = new Map([[graph.center, 0]]);
    const queue = [graph.center];
    for (let i = 0; i < queue.length; i++) {
      const u = queue[i], l = layer.get(u);
      for (const v of out.get(u) || []) if (!layer.has(v)) { layer.set(v, l + 1); queue.push(v); }
      for (const w of into.get(u) || []) if (!layer.has(w)) { layer.set(w, l - 1); queue.push(w); }
    }
    for (const n of graph.nodes) if (!layer.has(n.id)) { layer.set(n.id, 0); queue.push(n.id); }

    const layers = new Map();
    for (const id of queue) {
      const l = layer.get(id);
      if (!layers.has(l)) layers.set(l, []);
      layers.get(l).push(id);
    }
    const keys = [...layers.keys()].sort((a, b) => a - b);
    const rank = new Map();
    const rerank = (l) => layers.get(l).forEach((id, i) => rank.set(id, i));
    keys.forEach(rerank);
    const sweep = (ordered, neighbours) => {
      for (const l of ordered) {
        const ids = layers.get(l);
        const score = new Map();
        ids.forEach((id, i) => {
          const ns = neighbours(id).filter((n) => rank.has(n) && layer.get(n) !== l);
          score.set(id, ns.length ? ns.reduce((s, n) => s + rank.get(n), 0) / ns.length : i);
        });
        ids.sort((a, b) => score.get(a) - score.get(b));
        rerank(l);
      }
    };
    const both = (id) => out.get(id).concat(into.get(id));
    for (let pass = 0; pass < 4; pass++) {
      sweep(keys, both);
      sweep([...keys].reverse(), both);
    }

    const byId = new Map(graph.nodes.map((n) => [n.id, n]));
    const pos = new Map();
    const heights = keys.map((l) => layers.get(l).reduce((s, id) => s + HEAD_H + ROW_H * rowsOf(byId.get(id), graph.columnLevel) + GAP_Y, -GAP_Y));
    const tallest = Math.max(0, ...heights);
    keys.forEach((l, k) => {
      let y = PAD + (tallest - heights[k]) / 2;
      const x = PAD + k * (NODE_W + GAP_X);
      for (const id of layers.get(l)) {
        const h = HEAD_H + ROW_H * rowsOf(byId.get(id), graph.columnLevel);
        pos.set(id, { x, y, w: NODE_W, h, layer: l });
        y += h + GAP_Y;
      }
    });
    return { pos, layers, keys, width: PAD * 2 + keys.length * (NODE_W + GAP_X) - GAP_X, height: PAD * 2 + tallest };
  }

  function curve(x1, y1, x2, y2) {
    const bend = Math.max(40, Math.abs(x2 - x1) / 2);
    return "M" + x1 + "," + y1 + " C" + (x1 + bend) + "," + y1 + " " + (x2 - bend) + "," + y2 + " " + x2 + "," + y2;
  }

  function short(text, max) {
    return text.length <= max ? text : "\u2026" + text.slice(text.length - max + 1);
  }

  /** A name that fits the box: whole when short, else its last path segments (the file name first). */
  function fitted(name, max) {
    if (name.length <= max) return name;
    const parts = name.split("/");
    let out = parts.pop();
    while (parts.length && out.length + parts[parts.length - 1].length + 1 <= max - 2) out = parts.pop() + "/" + out;
    return short("\u2026/" + out, max);
  }

  /**
   * How many characters of a name and of a column fit a box, measured in this browser's own fonts (they
   * differ between browsers and systems: Firefox's sans-serif is wider than Chromium's here). One probe
   * per drawing; a detached target measures nothing and gets the counts that fit the widest usual fonts.
   */
  function fitting(target) {
    const sample = "station_monthly_summary.csv";
    const probe = svg("g", { class: "node" });
    const label = svg("text", { class: "label" }, sample);
    const column = svg("text", { class: "col" }, sample);
    probe.append(label, column);
    target.append(probe);
    const perLabel = label.getComputedTextLength() / sample.length;
    const perColumn = column.getComputedTextLength() / sample.length;
    probe.remove();
    return {
      label: perLabel > 0 ? Math.max(8, Math.floor((NODE_W - 62) / perLabel)) : 22,
      column: perColumn > 0 ? Math.max(8, Math.floor((NODE_W - 24) / perColumn)) : 28,
    };
  }

  /**
   * The per-character estimate misses for names of wide letters: every label is measured once (all reads
   * together, so one layout), and those still wider than the room are cut further, at most three rounds.
   */
  function shortenOverflowing(labels, room) {
    let over = labels;
    for (let round = 0; round < 3 && over.length; round++) {
      const widths = over.map(([t]) => t.getComputedTextLength());
      const next = [];
      over.forEach(([t, name], i) => {
        if (widths[i] <= room) return;
        t.textContent = fitted(name, Math.max(4, Math.floor(t.textContent.length * room / widths[i]) - 1));
        next.push([t, name]);
      });
      over = next;
    }
  }

  /** Draws the laid-out graph into an <svg>; returns Map id -> node element. */
  function draw(target, graph, placed, signs) {
    const pos = placed.pos;
    target.replaceChildren();
    target.setAttribute("width", placed.width);
    target.setAttribute("height", placed.height);
    target.setAttribute("viewBox", "0 0 " + placed.width + " " + placed.height);
    const defs = svg("defs", {});
    for (const ev of ["static", "runtime", "declared", "inferred", "column"]) {
      const m = svg("marker", { id: "tip-" + ev, viewBox: "0 0 10 10", refX: "9", refY: "5", markerWidth: "7", markerHeight: "7", orient: "auto-start-reverse" });
      m.append(svg("path", { d: "M0,0 L10,5 L0,10 z", class: "tip ev-" + ev }));
      defs.append(m);
    }
    target.append(defs);
    const fit = fitting(target);
    const labels = [];
    const edgeLayer = svg("g", { class: "edges" });
    const nodeLayer = svg("g", { class: "nodes" });
    const lit = graph.highlight || { nodes: new Set(), edges: new Set() };
    const dim = lit.nodes.size > 0;
    const rowY = (id, column) => {
      const n = graph.byId.get(id), p = pos.get(id);
      const i = n && n.columns ? n.columns.indexOf(column) : -1;
      return i >= 0 && i < MAX_ROWS ? p.y + HEAD_H + ROW_H * i + ROW_H / 2 : p.y + HEAD_H / 2;
    };
    const frag = document.createDocumentFragment();
    for (const e of graph.edges) {
      const a = pos.get(e.from), b = pos.get(e.to);
      if (!a || !b) continue;
      const on = lit.edges.has(e.key);
      const path = svg("path", {
        d: curve(a.x + a.w, a.y + HEAD_H / 2, b.x, b.y + HEAD_H / 2),
        class: "edge ev-" + e.evidence + (on ? " lit" : dim ? " dim" : "") + (graph.columnLevel ? " faint" : ""),
        "marker-end": "url(#tip-" + e.evidence + ")",
      });
      path.append(svg("title", {}, e.evidence + " \u00b7 confidence " + e.confidence.toFixed(2) + (e.script ? " \u00b7 " + e.script : "")));
      frag.append(path);
    }
    if (graph.columnLevel) {
      for (const f of graph.columnEdges || []) {
        const a = pos.get(f.from), b = pos.get(f.to);
        if (!a || !b) continue;
        const path = svg("path", {
          d: curve(a.x + a.w, rowY(f.from, f.fromColumn), b.x, f.influencing ? b.y + HEAD_H / 2 : rowY(f.to, f.toColumn)),
          class: "edge column" + (f.derived ? " derived" : "") + (f.influencing ? " influencing" : "") + (dim ? " dim" : ""),
          "marker-end": "url(#tip-column)",
        });
        path.append(svg("title", {}, f.fromColumn + " \u2192 " + (f.toColumn || "(rows of the target)") + (f.derived ? " (computed)" : f.influencing ? " (filters, joins or groups)" : " (copied)")));
        frag.append(path);
      }
    }
    edgeLayer.append(frag);

    const nodes = new Map();
    const nodeFrag = document.createDocumentFragment();
    for (const n of graph.nodes) {
      const p = pos.get(n.id);
      if (!p) continue;
      const g = svg("g", {
        class: "node kind-" + n.kind + (n.id === graph.center ? " centre" : "") + (lit.nodes.has(n.id) ? " lit" : dim ? " dim" : "") + (n.id === graph.selected ? " picked" : ""),
        transform: "translate(" + p.x + "," + p.y + ")", tabindex: "0", role: "button", "data-id": String(n.id),
        "aria-label": n.kind + " " + n.name + (n.expandable ? (n.expanded ? ", expanded" : ", collapsed") : ""),
      });
      g.append(svg("rect", { width: p.w, height: p.h, rx: "6", class: "box" }));
      g.append(svg("text", { x: "10", y: "22", class: "sign" }, (signs && signs[n.kind]) || "\u2022"));
      const label = svg("text", { x: "30", y: "22", class: "label" }, fitted(n.name, fit.label));
      labels.push([label, n.name]);
      g.append(label);
      g.append(svg("title", {}, n.name));
      if (n.expandable) {
        const t = svg("g", { class: "toggle", "data-toggle": String(n.id), transform: "translate(" + (p.w - 24) + ",8)" });
        t.append(svg("rect", { width: "18", height: "18", rx: "4" }), svg("text", { x: "9", y: "14" }, n.expanded ? "\u2212" : "+"));
        g.append(t);
      }
      if (graph.columnLevel && n.columns) {
        n.columns.slice(0, MAX_ROWS).forEach((c, i) => {
          g.append(svg("text", { x: "14", y: String(HEAD_H + ROW_H * i + 13), class: "col" + (graph.usedColumns && graph.usedColumns.has(n.id + "\u0000" + c) ? " used" : "") }, short(c, fit.column)));
        });
        if (n.columns.length > MAX_ROWS) {
          g.append(svg("text", { x: "14", y: String(HEAD_H + ROW_H * MAX_ROWS + 13), class: "col more" }, "+" + (n.columns.length - MAX_ROWS) + " more columns"));
        }
      }
      nodes.set(n.id, g);
      nodeFrag.append(g);
    }
    nodeLayer.append(nodeFrag);
    target.append(edgeLayer, nodeLayer);
    shortenOverflowing(labels, NODE_W - 58);
    return nodes;
  }

  /** A shortest directed path from a to b (either direction) over the given edges: {nodes, edges} or null. */
  function path(edges, a, b) {
    const walk = (from, to, forward) => {
      const next = new Map();
      for (const e of edges) {
        const [u, v] = forward ? [e.from, e.to] : [e.to, e.from];
        if (!next.has(u)) next.set(u, []);
        next.get(u).push([v, e.key]);
      }
      const back = new Map([[from, null]]);
      const queue = [from];
      for (let i = 0; i < queue.length; i++) {
        const u = queue[i];
        if (u === to) break;
        for (const [v, key] of next.get(u) || []) if (!back.has(v)) { back.set(v, [u, key]); queue.push(v); }
      }
      if (!back.has(to)) return null;
      const nodes = new Set([to]), keys = new Set();
      for (let at = to; back.get(at); at = back.get(at)[0]) { keys.add(back.get(at)[1]); nodes.add(back.get(at)[0]); }
      return { nodes, edges: keys };
    };
    return walk(a, b, true) || walk(a, b, false);
  }

  return { layout, draw, path };
})();
