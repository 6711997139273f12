// One script: what its code reads and writes (with the line, and the expression when unresolved), its
// runs, and links to every file it produces.
"use strict";

hw.views.script = async function (main, route) {
  let id = route.parts[1];
  if (!id && route.params.get("name")) {
    const name = route.params.get("name");
    const all = await hw.get("/api/scripts?limit=1000");
    const s = all.find((x) => x.name === name || x.uri.endsWith("/" + name));
    if (!s) {
      main.append(hw.section("No script is called that", hw.el("p", name, "mono")));
      return;
    }
    id = String(s.id);
    history.replaceState(null, "", "#/script/" + id);
  }
  let s;
  try {
    s = await hw.get("/api/scripts/" + encodeURIComponent(id));
  } catch (e) {
    main.append(hw.section("Script not found", hw.el("p", e.message, "notice")));
    return;
  }
  document.title = s.name + " · Headwater";
  let authors = s.git_authors;
  if (Array.isArray(authors)) authors = authors.map((a) => (typeof a === "string" ? a : a.name)).join(", ");
  main.append(hw.h("section", "panel head", hw.h("h1", null, hw.kindBadge("script"), " ", hw.el("span", s.name, "title-name")),
    hw.facts([["Language", s.language], ["Location", hw.el("span", s.uri, "mono")], ["Source", s.source],
      ["Size", s.size_bytes !== null ? hw.number(s.size_bytes) + " bytes" : null], ["Modified", hw.when(s.modified_at)],
      ["Last commit", s.git_commit ? s.git_commit.slice(0, 12) + (s.git_author ? " by " + s.git_author : "") + (s.git_committed_at ? ", " + hw.when(s.git_committed_at) : "") : null],
      ["People who changed it", authors || null], ["Present", s.present ? null : "no longer present"]])));

  const refs = await hw.get("/api/scripts/" + s.id + "/reads").catch(() => []);
  const where = (r) => "line " + r.line + (r.cell !== null ? ", cell " + r.cell : "");
  const target = (r) => r.resolved && r.dataset ? hw.link(hw.datasetByName(r.dataset), r.dataset) : hw.el("span", r.pattern || r.expression || "?", "mono unresolved");
  const block = (direction, title) => {
    const mine = refs.filter((r) => r.direction === direction);
    const section = hw.section(title + " (" + mine.length + ")");
    section.id = direction === "write" ? "writes" : "reads";
    if (!mine.length) { section.append(hw.el("p", "Nothing found in the code.", "quiet")); return section; }
    section.append(hw.table(["Dataset or path", "Call", "Where", "Expression", "Resolved", "Confidence"], mine.map((r) => [
      target(r), hw.el("span", r.function || "", "mono"), where(r), hw.el("span", r.expression || "", "mono"), r.resolved ? "yes" : "no", r.confidence.toFixed(2)])));
    return section;
  };
  main.append(block("read", "Reads"), block("write", "Writes"));

  const runs = await hw.get("/api/scripts/" + s.id + "/runs").catch(() => []);
  const runBox = hw.section("Runs (" + runs.length + ")");
  if (!runs.length) runBox.append(hw.el("p", "No run of this script has been captured. Run it through a Headwater connector to record its runs.", "quiet"));
  else runBox.append(hw.table(["Started", "Ended", "User", "Host", "Commit", "Exit", "Reads", "Writes"], runs.map((r) => [
    hw.when(r.started_at), hw.when(r.ended_at), r.user || "", r.host || "", r.git_commit ? r.git_commit.slice(0, 10) : "",
    r.exit_code === null ? (r.exception ? "failed: " + r.exception : "") : (r.exit_code === 0 ? "0 (ok)" : String(r.exit_code)), r.reads, r.writes])));
  main.append(runBox);
};
