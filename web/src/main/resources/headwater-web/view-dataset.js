// One dataset: what it is, its columns with their profile, owners, freshness, partitions, how its schema
// changed, the scripts and runs around it, and the form editors use for description, tags and owners.
"use strict";

hw.views.dataset = async function (main, route) {
  let id = route.parts[1];
  if (!id && route.params.get("name")) {
    const name = route.params.get("name");
    const found = await hw.get("/api/datasets?match=" + encodeURIComponent(name));
    const exact = found.items.filter((d) => d.name === name);
    const pick = exact.length === 1 ? exact : found.items;
    if (pick.length === 1) {
      history.replaceState(null, "", hw.datasetHref(pick[0].id));
      id = String(pick[0].id);
    } else {
      main.append(hw.section(pick.length ? "Several datasets have that name" : "No dataset is called that",
        hw.el("p", name, "mono"),
        hw.h("ul", "plain", ...pick.map((d) => hw.h("li", null, hw.link(hw.datasetHref(d.id), d.name))))));
      return;
    }
  }
  let d;
  try {
    d = await hw.get("/api/datasets/" + encodeURIComponent(id));
  } catch (e) {
    main.append(hw.section("Dataset not found", hw.el("p", e.message, "notice")));
    return;
  }
  document.title = d.name + " · Headwater";
  const details = d.details || {};

  const head = hw.h("section", "panel head",
    hw.h("h1", null, hw.kindBadge(d.kind), " ", hw.el("span", d.name, "title-name")),
    hw.h("p", "actions",
      hw.link("#/lineage/" + d.id, "Lineage graph", "button"),
      hw.link("#/impact?target=" + d.id + "&change=delete", "What would break?", "button"),
      d.kind === "figure" || d.content_hash ? hw.link("#/whence?dataset=" + d.id, "Where did it come from?", "button") : null),
    hw.facts([
      ["Format", d.present ? d.format : "no longer present (" + (d.format || "unknown") + ")"],
      ["Location", hw.el("span", d.uri, "mono")],
      ["Source", d.source],
      ["Size", d.size_bytes !== null ? hw.number(d.size_bytes) + " bytes" : null],
      ["Modified", hw.when(d.modified_at)],
      ["First seen", hw.when(d.first_seen)],
      ["Rows", d.row_count !== null ? hw.number(d.row_count) + (d.row_count_exact ? "" : " (estimated)") : null],
      ["Description", d.description],
      ["Tags", d.tags.length ? hw.h("span", null, ...d.tags.map((t) => hw.el("span", t, "tag"))) : null],
      ["Problem", d.error ? hw.el("span", d.error, "problem") : null],
      ["SHA-256", d.content_hash ? hw.el("span", d.content_hash, "mono") : null],
    ]));
  main.append(head);

  if (d.kind === "figure") main.append(figurePreview(d));

  // Owners and freshness
  const owners = d.owners || [];
  const ownerList = hw.el("ul", null, "plain");
  for (const o of owners) {
    ownerList.append(hw.h("li", null, hw.el("strong", o.name), o.kind ? hw.el("span", " " + o.kind, "quiet") : null,
      o.reason ? " \u2014 " + o.reason : null, o.inherited ? hw.el("span", " (inherited)", "quiet") : null));
  }
  if (!owners.length) ownerList.append(hw.el("li", "Nobody is named as owner yet.", "quiet"));
  const fresh = hw.el("div");
  fresh.id = "freshness";
  main.append(hw.h("div", "two", hw.section("Owners", ownerList), hw.section("Freshness", fresh)));
  hw.optional("/api/datasets/" + d.id + "/freshness").then((f) => {
    if (!f) { fresh.append(hw.notAvailable("Freshness checking")); return; }
    fresh.append(hw.h("p", null, hw.el("span", f.state, "state state-" + f.state), f.since ? " since " + hw.when(f.since) : null),
      f.why ? hw.el("p", f.why) : null, f.policy ? hw.el("p", "Rule: " + (typeof f.policy === "string" ? f.policy : JSON.stringify(f.policy)), "quiet") : null);
  }).catch((e) => fresh.append(hw.el("p", e.message, "notice")));

  // Columns with their profile
  if (d.columns.length) {
    const stats = {};
    for (const s of details.column_stats || []) stats[s.name] = s;
    const rows = d.columns.map((c) => {
      const s = stats[c.name] || {};
      const range = s.min !== undefined || s.max !== undefined ? (s.min ?? "") + " \u2026 " + (s.max ?? "") : "";
      return [c.ordinal, hw.el("span", c.name, "mono"), c.type, s.null_count !== undefined ? hw.number(s.null_count) : (c.nullable ? "some" : "none"),
        range, s.distinct_estimate !== undefined ? "\u2248 " + hw.number(s.distinct_estimate) : "", s.description || c.description || ""];
    });
    const section = hw.section("Columns", hw.table(["#", "Name", "Type", "Empty values", "Smallest \u2026 largest", "Distinct", "Description"], rows, "columns"));
    section.id = "columns";
    const samples = (details.column_stats || []).filter((s) => Array.isArray(s.top_values) && s.top_values.length);
    if (samples.length) {
      // Present only when the source was set to sample values; the harvester keeps none otherwise.
      section.append(hw.el("h3", "Sampled values (sampling is on for this source)"),
        hw.table(["Column", "Frequent values"], samples.map((s) => [s.name, s.top_values.map((v) => typeof v === "object" ? v.value : v).join(", ")])));
    }
    main.append(section);
  }

  if (d.partitions.length) {
    main.append(hw.section("Partitions (" + d.partitions.length + ")", hw.table(["File", "Keys", "Rows", "Size", "Modified", "Problem"],
      d.partitions.map((p) => [hw.el("span", p.name, "mono"), p.keys ? Object.entries(p.keys).map(([k, v]) => k + "=" + v).join(", ") : "",
        p.row_count !== null ? hw.number(p.row_count) : "", hw.number(p.size_bytes), hw.when(p.modified_at), p.error || ""]))));
  }

  // Scripts that write (its upstream edges) and read it (its downstream edges)
  const writers = [...new Set(d.upstream.map((e) => e.script).filter(Boolean))];
  const readers = [...new Set(d.downstream.map((e) => e.script).filter(Boolean))];
  const scriptList = (names) => names.length ? hw.h("ul", "plain", ...names.map((n) => hw.h("li", null, hw.kindBadge("script"), hw.link(hw.scriptByName(n), n))))
    : hw.el("p", "None known.", "quiet");
  const edgeList = (edges) => edges.length ? hw.h("ul", "plain", ...edges.map((e) => hw.h("li", null, hw.link(hw.datasetHref(e.dataset_id), e.dataset_name),
    hw.el("span", " " + e.evidence + ", " + e.corroboration + ", confidence " + e.combined_confidence.toFixed(2), "quiet"))))
    : hw.el("p", "None known.", "quiet");
  main.append(hw.h("div", "two",
    hw.section("Made by", scriptList(writers), hw.el("h3", "from"), edgeList(d.upstream)),
    hw.section("Read by", scriptList(readers), hw.el("h3", "into"), edgeList(d.downstream))));

  const runs = hw.el("div");
  const history = hw.el("div");
  main.append(hw.section("Runs that touched it", runs), hw.section("Schema history", history));
  hw.get("/api/datasets/" + d.id + "/runs").then((list) => {
    if (!list.length) { runs.append(hw.el("p", "No run of a captured script has read or written it.", "quiet")); return; }
    runs.append(hw.table(["Script", "Started", "Ended", "User", "Commit", "Exit"], list.map((r) => [
      hw.link(hw.scriptByName(r.script), r.script), hw.when(r.started_at), hw.when(r.ended_at), r.user || "", r.git_commit ? r.git_commit.slice(0, 10) : "",
      r.exit_code === null ? "" : String(r.exit_code)])));
  }).catch((e) => runs.append(hw.el("p", e.message, "notice")));
  hw.get("/api/datasets/" + d.id + "/schema-history").then((versions) => {
    if (!versions.length) { history.append(hw.el("p", "No schema recorded.", "quiet")); return; }
    const fromTable = versions.some((v) => v.table_version);
    const tableCells = (v) => fromTable ? [v.table_version || "", v.recorded_at ? hw.when(v.recorded_at) : "", v.operation || ""] : [];
    history.append(hw.table(["Version"].concat(fromTable ? ["Table version", "Recorded by the table", "Operation"] : [],
      ["From", "Until", "Columns", "Added", "Removed", "Retyped"]), versions.map((v) => [v.version].concat(tableCells(v), [
      hw.when(v.valid_from), v.valid_to ? hw.when(v.valid_to) : "current", v.columns.length,
      v.drift ? v.drift.added.join(", ") : "", v.drift ? v.drift.removed.join(", ") : "", v.drift ? v.drift.retyped.join(", ") : ""]))));
  }).catch((e) => history.append(hw.el("p", e.message, "notice")));

  if (d.source) main.append(lastHarvest(d));
  main.append(editForm(d));
};

/** The latest harvest of the dataset's source, and what it could not read of this dataset. */
function lastHarvest(d) {
  const box = hw.section("Last harvest of " + d.source);
  box.id = "last-harvest";
  hw.get("/api/harvests?limit=50").then(async (list) => {
    const h = list.find((x) => x.source === d.source);
    if (!h) { box.append(hw.el("p", "No harvest of this source is recorded.", "quiet")); return; }
    box.append(hw.el("p", (h.finished_at ? "Finished " + hw.when(h.finished_at) : "Running since " + hw.when(h.started_at)) + ", " + h.status + ": " +
      hw.number(h.files_seen) + " files seen, " + hw.number(h.errors) + " could not be read."));
    if (!h.errors) return;
    const full = await hw.get("/api/harvests/" + h.id);
    const mine = full.error_list.filter((e) => e.uri === d.uri || (d.partitions || []).some((p) => p.uri === e.uri));
    box.append(mine.length ? hw.table(["File", "Kind", "Why"], mine.map((e) => [hw.el("span", e.uri, "mono"), e.kind, e.message]))
      : hw.el("p", "None of them belongs to this dataset.", "quiet"));
  }).catch((e) => box.append(hw.el("p", e.message, "notice")));
  return box;
}

function figurePreview(d) {
  const box = hw.section("Preview");
  box.id = "preview";
  const src = "/api/ui/figure/" + d.id;
  if (d.format === "pdf") {
    box.append(hw.el("p", "A PDF figure" + (d.details && d.details.pages ? " of " + d.details.pages + " page(s)" : "") + ": the preview shows images only.", "quiet"));
  } else {
    const img = hw.el("img", null, "figure");
    img.alt = "Preview of " + d.name;
    img.src = src;
    img.addEventListener("error", () => img.replaceWith(hw.el("p", "The file cannot be shown: it is gone or outside the harvested folders.", "notice")));
    box.append(img);
  }
  const title = d.details && (d.details.title || (d.details.text && d.details.text.Title));
  if (title) box.append(hw.el("p", title, "caption"));
  return box;
}

function editForm(d) {
  const form = hw.el("form", null, "edit");
  const field = (label, control) => hw.h("label", "field", hw.el("span", label), control);
  const description = hw.el("textarea");
  description.value = d.description || "";
  description.rows = 3;
  const tags = hw.el("input");
  tags.value = d.tags.join(", ");
  const owners = hw.el("input");
  owners.value = (d.owners || []).filter((o) => !o.inherited).map((o) => o.name).join(", ");
  const author = hw.el("input");
  author.value = sessionStorage.getItem("headwater.author") || "";
  const token = hw.el("input");
  token.type = "password";
  token.autocomplete = "off";
  token.value = hw.token();
  const status = hw.el("p", null, "quiet");
  status.setAttribute("role", "status");
  const save = hw.el("button", "Save");
  save.type = "submit";
  form.append(field("Description", description), field("Tags, separated by commas", tags),
    field("Owners, separated by commas", owners), field("Your name (kept with the change)", author),
    field("Access token (kept in this tab only)", token), save, status);
  form.addEventListener("submit", async (e) => {
    e.preventDefault();
    hw.setToken(token.value.trim());
    sessionStorage.setItem("headwater.author", author.value.trim());
    const split = (s) => s.split(",").map((t) => t.trim()).filter(Boolean);
    try {
      await hw.send("PUT", "/api/datasets/" + d.id + "/note", { description: description.value, tags: split(tags.value), author: author.value.trim() || "web" });
      const wanted = split(owners.value).sort().join(",");
      const had = (d.owners || []).filter((o) => !o.inherited).map((o) => o.name).sort().join(",");
      if (wanted !== had) {
        try {
          await hw.send("PUT", "/api/datasets/" + d.id + "/owners", { owners: split(owners.value).map((name) => ({ name, kind: "person" })), author: author.value.trim() || "web" });
        } catch (err) {
          if (err.status === 404) { status.textContent = "Saved the description and tags; editing owners is not available on this server yet."; return; }
          throw err;
        }
      }
      status.textContent = "Saved.";
      window.dispatchEvent(new HashChangeEvent("hashchange"));
    } catch (err) {
      status.textContent = "Not saved: " + err.message;
    }
  });
  const details = hw.h("details", "panel", hw.el("summary", "Edit description, tags and owners"), form);
  return details;
}
