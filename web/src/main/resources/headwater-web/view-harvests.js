// Harvests: running and recent harvests with their counts and problems. Live from the server's status
// stream (/api/harvest-events, server-sent events): a harvest's row counts up as it runs. When the stream
// cannot be had (an older server, too many open streams, a server whose reads need a token, which an
// EventSource cannot send) the page falls back to reading the list every 2 seconds while a harvest runs.
"use strict";

hw.views.harvests = async function (main) {
  const box = hw.section("Harvests");
  const note = hw.el("p", null, "quiet");
  note.id = "harvest-note";
  note.setAttribute("role", "status");
  const now = hw.el("div");
  now.id = "harvest-now";
  const list = hw.el("div");
  list.id = "harvest-list";
  box.append(note, now, list);
  main.append(box);

  let harvests = [];
  const live = new Map(); // harvest id -> latest started/progress event
  const problems = new Map(); // harvest id -> problem events heard while it ran (the first 20)
  let mode = "starting";
  let timer = null;
  let stopped = false;
  let stream = null;

  function running() {
    return harvests.filter((h) => !h.finished_at || live.has(h.id));
  }

  function sayMode() {
    const n = running().length;
    if (mode === "live") note.textContent = (n ? n + " running. " : "Nothing is running. ") + "This page follows harvests as they happen.";
    else note.textContent = n ? n + " running; this list refreshes every 2 seconds." : "Nothing is running. The latest harvests:";
  }

  function render() {
    sayMode();
    now.replaceChildren(...[...live.values()].map((e) => {
      const heard = problems.get(e.harvest_id) || [];
      return hw.h("div", "harvest-live",
        hw.h("p", null, hw.el("strong", e.source || "harvest " + e.harvest_id), " ",
          hw.el("span", hw.number(e.files_seen || 0) + " files so far", "live-count"),
          e.errors ? hw.el("span", ", " + e.errors + (e.errors === 1 ? " problem" : " problems"), "problem") : null),
        heard.length ? hw.table(["File", "Kind", "Why"], heard.map((p) => [hw.el("span", p.uri, "mono"), p.kind, p.message])) : null);
    }));
    list.replaceChildren(hw.table(["Source", "Started", "Finished", "State", "Files seen", "Unchanged", "Datasets", "Scripts", "Changes", "Removed", "Errors"],
      harvests.map((h) => {
        const l = live.get(h.id);
        const seen = l ? l.files_seen : h.files_seen;
        const errors = l ? l.errors : h.errors;
        return [h.source, hw.when(h.started_at), h.finished_at && !l ? hw.when(h.finished_at) : hw.el("span", "running", "state state-due"), l ? "running" : h.status,
          hw.number(seen), hw.number(h.files_unchanged), hw.number(h.datasets), hw.number(h.scripts), hw.number(h.changes), hw.number(h.removed),
          errors ? hw.el("span", String(errors), "problem") : "0"];
      })));
  }

  async function load() {
    try {
      harvests = await hw.get("/api/harvests?limit=30");
    } catch (e) {
      note.textContent = e.message;
      return;
    }
    if (stopped) return;
    render();
    for (const h of harvests.filter((x) => x.finished_at && x.errors > 0).slice(0, 5)) {
      const one = await hw.get("/api/harvests/" + h.id).catch(() => null);
      if (!one || stopped) continue;
      list.append(hw.h("details", "errors", hw.el("summary", h.errors + " files of " + h.source + " could not be read (" + hw.when(h.started_at) + ")"),
        hw.table(["File", "Kind", "Why"], one.error_list.map((e) => [hw.el("span", e.uri, "mono"), e.kind, e.message]))));
    }
  }

  async function poll() {
    clearTimeout(timer);
    await load();
    if (!stopped && mode === "polling" && running().length) timer = setTimeout(poll, 2000);
  }

  function heard(handler) {
    return (message) => { if (!stopped) handler(JSON.parse(message.data)); };
  }

  if (window.EventSource) {
    stream = new EventSource("/api/harvest-events");
    stream.addEventListener("hello", () => { mode = "live"; clearTimeout(timer); load(); });
    stream.addEventListener("started", heard((e) => { live.set(e.harvest_id, e); load(); }));
    stream.addEventListener("progress", heard((e) => {
      const known = harvests.some((h) => h.id === e.harvest_id);
      live.set(e.harvest_id, e);
      if (known) render(); else load();
    }));
    stream.addEventListener("problem", heard((e) => {
      const l = live.get(e.harvest_id);
      if (l) live.set(e.harvest_id, Object.assign({}, l, { errors: e.errors }));
      const heardSoFar = problems.get(e.harvest_id) || [];
      if (heardSoFar.length < 20) heardSoFar.push(e);
      problems.set(e.harvest_id, heardSoFar);
      render();
    }));
    stream.addEventListener("finished", heard((e) => { live.delete(e.harvest_id); problems.delete(e.harvest_id); load(); }));
    // A connection failure (not one of our events: those carry data). The browser retries by itself after
    // a dropped connection; after a refusal (401, 404, 503) it gives up, so the page polls.
    stream.onerror = () => {
      if (stopped) return;
      if (stream.readyState === EventSource.CLOSED || mode !== "live") {
        mode = "polling";
        poll();
      }
    };
  } else {
    mode = "polling";
  }
  await load();
  if (mode === "polling") poll();
  return () => { stopped = true; clearTimeout(timer); if (stream) stream.close(); };
};
