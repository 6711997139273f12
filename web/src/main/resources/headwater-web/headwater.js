// Shared helpers of the Headwater pages. Every value from the catalog is put on the page as text
// (textContent), never as HTML, because names, columns and descriptions come from files people made.
// The one exception is a search snippet, which the server escapes itself and marks with <mark> only.
"use strict";

const hw = {
  views: {},

  /** GET a JSON answer; throws an Error with the server's message on a 4xx or 5xx. */
  async get(path) {
    const answer = await hw.fetchJson(path);
    if (!answer.ok) throw hw.failure(answer);
    return answer.body;
  },

  /**
   * GET an endpoint that a newer server may have and this one may not: null when the server has no such
   * endpoint (a 404 without our error body, or one that says so), so the page can say "not available" instead of failing.
   */
  async optional(path) {
    const answer = await hw.fetchJson(path);
    if (answer.status === 404 && (!answer.body.error || /No such endpoint/.test(answer.body.message || ""))) return null;
    if (!answer.ok) throw hw.failure(answer);
    return answer.body;
  },

  async fetchJson(path, init) {
    const response = await fetch(path, Object.assign({ headers: { Accept: "application/json" } }, init || {}));
    const body = await response.json().catch(() => ({}));
    return { ok: response.ok, status: response.status, body };
  },

  failure(answer) {
    const error = new Error(answer.body.message || ("The server answered " + answer.status));
    error.status = answer.status;
    return error;
  },

  /**
   * A write. JSON body plus a custom header: a page on another site cannot send either without the
   * browser asking this server first (CORS preflight), which it refuses. The token the user pasted goes
   * in the Authorization header; it stays in this tab's sessionStorage only.
   */
  async send(method, path, body) {
    const headers = { "Content-Type": "application/json", Accept: "application/json", "X-Headwater-Request": "browser" };
    const token = hw.token();
    if (token) headers.Authorization = "Bearer " + token;
    const answer = await hw.fetchJson(path, { method, headers, body: JSON.stringify(body) });
    if (!answer.ok) throw hw.failure(answer);
    return answer.body;
  },

  token() {
    return sessionStorage.getItem("headwater.token") || "";
  },

  setToken(value) {
    if (value) sessionStorage.setItem("headwater.token", value);
    else sessionStorage.removeItem("headwater.token");
  },

  el(tag, text, className) {
    const node = document.createElement(tag);
    if (text !== undefined && text !== null) node.textContent = String(text);
    if (className) node.className = className;
    return node;
  },

  /** An element with children: strings become text nodes, null is skipped. */
  h(tag, className, ...children) {
    const node = document.createElement(tag);
    if (className) node.className = className;
    for (const child of children) {
      if (child === null || child === undefined || child === false) continue;
      node.append(typeof child === "object" ? child : String(child));
    }
    return node;
  },

  /** A link inside the UI; only our own hash addresses, so a catalog value can never become a javascript: link. */
  link(href, text, className) {
    const a = hw.el("a", text, className);
    a.href = href.startsWith("#/") ? href : "#/";
    return a;
  },

  datasetHref(id) {
    return "#/dataset/" + encodeURIComponent(id);
  },

  datasetByName(name) {
    return "#/dataset?name=" + encodeURIComponent(name);
  },

  scriptByName(name) {
    return "#/script?name=" + encodeURIComponent(name);
  },

  /** A short sign for each kind of thing; text, so screen readers read the kind beside it. */
  kindSigns: { file: "▤", file_set: "▦", figure: "◩", table: "▥", view: "◫", script: "✎", other: "◇", column: "┃" },

  kindBadge(kind) {
    const badge = hw.el("span", null, "kind kind-" + String(kind).replace(/[^a-z_]/g, ""));
    badge.append(hw.el("span", hw.kindSigns[kind] || "•", "sign"), hw.el("span", String(kind).replace("_", " ")));
    return badge;
  },

  section(title, ...children) {
    return hw.h("section", "panel", hw.el("h2", title), ...children);
  },

  notAvailable(what) {
    return hw.el("p", what + " is not available on this server yet.", "notice");
  },

  /** A table from rows of cell values (strings or nodes). */
  table(headings, rows, className) {
    const table = hw.el("table", null, "grid " + (className || ""));
    const head = hw.el("tr");
    for (const h of headings) head.append(hw.el("th", h));
    table.append(hw.h("thead", null, head));
    const body = hw.el("tbody");
    for (const row of rows) {
      const tr = hw.el("tr");
      for (const cell of row) {
        const td = hw.el("td");
        if (cell !== null && cell !== undefined) td.append(typeof cell === "object" ? cell : String(cell));
        tr.append(td);
      }
      body.append(tr);
    }
    table.append(body);
    return table;
  },

  facts(pairs) {
    const dl = hw.el("dl", null, "facts");
    for (const [label, value] of pairs) {
      if (value === null || value === undefined || value === "") continue;
      const dd = hw.el("dd");
      dd.append(typeof value === "object" ? value : String(value));
      dl.append(hw.el("dt", label), dd);
    }
    return dl;
  },

  when(iso) {
    if (!iso) return "";
    const d = new Date(iso);
    return isNaN(d) ? String(iso) : d.toISOString().replace("T", " ").replace(/\.\d+Z$/, "Z").replace(/:\d\dZ$/, " UTC");
  },

  number(n) {
    return n === null || n === undefined ? "" : Number(n).toLocaleString("en");
  },

  /** The current address as {parts, params}: "#/dataset/12?x=1" gives ["dataset","12"] and x=1. */
  route() {
    const raw = location.hash.replace(/^#\/?/, "");
    const [path, query] = raw.split("?");
    return { parts: path.split("/").filter(Boolean).map(decodeURIComponent), params: new URLSearchParams(query || "") };
  },

  /** Rewrites the query part of the address without a new history entry (typing, toggles). */
  replaceParams(params) {
    const base = location.hash.split("?")[0] || "#/";
    const text = params.toString();
    history.replaceState(null, "", base + (text ? "?" + text : ""));
  },
};
