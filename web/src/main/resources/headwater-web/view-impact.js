// What would break: the impact report of a planned change to a dataset or a column, grouped by
// distance, with the owners to tell and a button that copies the report as Markdown.
"use strict";

hw.views.impact = async function (main, route) {
  const p = route.params;
  const target = hw.el("input");
  Object.assign(target, { id: "impact-target", value: p.get("target") || "", placeholder: "dataset name or id, or name.column" });
  const change = hw.el("select");
  change.id = "impact-change";
  for (const [value, label] of [["drop", "drop a column"], ["rename", "rename a column"], ["retype", "change a column's type"], ["delete", "delete the dataset"], ["stale", "stop updating it"]]) {
    const o = hw.el("option", label);
    o.value = value;
    change.append(o);
  }
  change.value = p.get("change") || "drop";
  const go = hw.el("button", "Show the impact");
  go.type = "submit";
  const form = hw.h("form", "inline", hw.h("label", "field", hw.el("span", "What changes"), target), hw.h("label", "field", hw.el("span", "Change"), change), go);
  const out = hw.el("div");
  out.id = "impact-report";
  main.append(hw.section("What would break?", form), out);

  form.addEventListener("submit", (e) => {
    e.preventDefault();
    location.hash = "#/impact?" + new URLSearchParams({ target: target.value.trim(), change: change.value }).toString();
  });

  if (!target.value) {
    out.append(hw.el("p", "Name a dataset (its name as the catalog shows it, or its number) or a column (dataset.column) and a kind of change.", "quiet"));
    return;
  }
  const query = new URLSearchParams({ target: target.value, change: change.value }).toString();
  let report;
  try {
    report = await hw.optional("/api/impact?" + query);
  } catch (e) {
    out.append(hw.el("p", e.message, "notice"));
    return;
  }
  if (report === null) {
    out.append(hw.notAvailable("The impact report"));
    return;
  }
  const counts = hw.h("ul", "chips counts", ...Object.entries(report.counts || {}).map(([k, n]) => hw.el("li", k.replace(/_/g, " ") + ": " + n)));
  const owners = new Set();
  for (const a of report.affected) for (const o of a.owners || []) owners.add(typeof o === "string" ? o : o.name);
  const copy = hw.el("button", "Copy as Markdown");
  copy.type = "button";
  copy.id = "copy-markdown";
  const copied = hw.el("span", null, "quiet");
  copied.setAttribute("role", "status");
  const text = hw.el("pre", null, "markdown");
  text.hidden = true;
  copy.addEventListener("click", async () => {
    const response = await fetch("/api/impact?" + query + "&format=markdown", { headers: { Accept: "text/markdown" } });
    const md = await response.text();
    text.textContent = md;
    text.hidden = false;
    try {
      await navigator.clipboard.writeText(md);
      copied.textContent = " Copied.";
    } catch (e) {
      copied.textContent = " The browser did not allow copying; select the text below.";
    }
  });
  const summary = hw.section("Impact of " + change.options[change.selectedIndex].text + " on " + target.value, counts,
    hw.h("p", null, "Tell: ", owners.size ? [...owners].join(", ") : "nobody is named as owner of what is affected."), hw.h("p", null, copy, copied), text);
  out.append(summary);
  if (!report.affected.length) {
    out.append(hw.section("Nothing downstream", hw.el("p", "Nothing the catalog knows of uses it.", "quiet")));
    return;
  }
  const groups = new Map();
  for (const a of report.affected) {
    if (!groups.has(a.distance)) groups.set(a.distance, []);
    groups.get(a.distance).push(a);
  }
  for (const [distance, items] of [...groups.entries()].sort((a, b) => a[0] - b[0])) {
    out.append(hw.section(distance + (distance === 1 ? " step" : " steps") + " away", hw.table(["What", "Kind", "Owners", "Through", "How"], items.map((a) => [
      a.kind === "script" ? hw.link(hw.scriptByName(a.name), a.name) : a.kind === "column" ? hw.el("span", a.name, "mono") : hw.link(hw.datasetByName(a.name), a.name),
      hw.kindBadge(a.kind), (a.owners || []).map((o) => (typeof o === "string" ? o : o.name)).join(", "),
      (a.path || []).map((s) => (typeof s === "string" ? s : s.name || JSON.stringify(s))).join(" \u2192 "), a.indirect ? "indirect (filters or joins)" : "direct"]), "affected")));
  }
};
