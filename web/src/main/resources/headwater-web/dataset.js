"use strict";

(async function () {
  const id = new URLSearchParams(location.search).get("id");
  const name = document.getElementById("name");
  if (!id) {
    name.textContent = "No dataset named in the address.";
    return;
  }
  let d;
  try {
    d = await hw.get("/api/datasets/" + encodeURIComponent(id));
  } catch (e) {
    name.textContent = e.message;
    return;
  }
  document.title = d.name + " · Headwater";
  name.textContent = d.name;

  const facts = document.getElementById("facts");
  const fact = (label, value) => {
    if (value === null || value === undefined || value === "") return;
    facts.append(hw.el("dt", label), hw.el("dd", value));
  };
  fact("Kind", d.kind);
  fact("Format", d.present ? d.format : "no longer present");
  fact("Location", d.uri);
  fact("Source", d.source);
  if (d.size_bytes !== null) fact("Size", d.size_bytes.toLocaleString() + " bytes");
  fact("Modified", d.modified_at);
  if (d.row_count !== null) fact("Rows", d.row_count.toLocaleString() + (d.row_count_exact ? "" : " (estimated)"));
  fact("About", d.description);
  if (d.tags.length) fact("Tags", d.tags.join(", "));
  for (const o of d.owners) fact("Owner", o.name + " \u2014 " + o.reason);
  fact("Problem", d.error);
  fact("SHA-256", d.content_hash);

  const body = document.querySelector("#columns tbody");
  if (!d.columns.length) {
    document.getElementById("columns").hidden = true;
    document.getElementById("no-columns").hidden = false;
  }
  for (const c of d.columns) {
    const row = hw.el("tr");
    row.append(hw.el("td", c.ordinal), hw.el("td", c.name), hw.el("td", c.type), hw.el("td", c.nullable ? "yes" : "no"));
    body.append(row);
  }

  const lineage = document.getElementById("lineage");
  const edges = [
    ...d.upstream.map((e) => ["from", e]),
    ...d.downstream.map((e) => ["to", e]),
  ];
  if (!edges.length) lineage.append(hw.el("li", "No lineage recorded yet.", "quiet"));
  for (const [direction, e] of edges) {
    const item = hw.el("li", direction + " ");
    item.append(hw.link(hw.datasetHref(e.dataset_id), e.dataset_name));
    item.append(hw.el("span", " via " + (e.script || "unknown script") + " (" + e.evidence + ")", "quiet"));
    lineage.append(item);
  }
})();
