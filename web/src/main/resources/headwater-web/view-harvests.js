// Harvests: running and recent harvests with their counts and errors, polled every two seconds while one
// is running (polling rather than a stream: the list endpoint exists today and the answer is small).
"use strict";

hw.views.harvests = async function (main) {
  const box = hw.section("Harvests");
  const list = hw.el("div");
  list.id = "harvest-list";
  const note = hw.el("p", null, "quiet");
  box.append(note, list);
  main.append(box);
  let timer = null;
  let stopped = false;

  async function poll() {
    let harvests;
    try {
      harvests = await hw.get("/api/harvests?limit=30");
    } catch (e) {
      note.textContent = e.message;
      return;
    }
    if (stopped) return;
    const running = harvests.filter((h) => !h.finished_at);
    note.textContent = running.length ? running.length + " running; this list refreshes every 2 seconds." : "Nothing is running. The latest harvests:";
    list.replaceChildren(hw.table(["Source", "Started", "Finished", "State", "Files seen", "Unchanged", "Datasets", "Scripts", "Changes", "Removed", "Errors"],
      harvests.map((h) => [h.source, hw.when(h.started_at), h.finished_at ? hw.when(h.finished_at) : hw.el("span", "running", "state state-due"), h.status,
        hw.number(h.files_seen), hw.number(h.files_unchanged), hw.number(h.datasets), hw.number(h.scripts), hw.number(h.changes), hw.number(h.removed),
        h.errors ? hw.el("span", String(h.errors), "problem") : "0"])));
    for (const h of harvests.filter((x) => x.errors > 0).slice(0, 5)) {
      const one = await hw.get("/api/harvests/" + h.id).catch(() => null);
      if (!one || stopped) continue;
      list.append(hw.h("details", "errors", hw.el("summary", h.errors + " files of " + h.source + " could not be read (" + hw.when(h.started_at) + ")"),
        hw.table(["File", "Kind", "Why"], one.error_list.map((e) => [hw.el("span", e.uri, "mono"), e.kind, e.message]))));
    }
    if (running.length) timer = setTimeout(poll, 2000);
  }
  await poll();
  return () => { stopped = true; clearTimeout(timer); };
};
