// "Where did this come from?": the browser hashes a file locally with Web Crypto (SHA-256) and sends
// only the hash; the file itself never leaves the machine.
"use strict";

hw.views.whence = async function (main, route) {
  const input = hw.el("input");
  input.type = "file";
  input.id = "whence-file";
  const zone = hw.h("label", "drop", hw.el("strong", "Drop a file here, or choose one"),
    hw.el("span", "A figure from a report, a CSV someone sent you: it is read here, in your browser, and only its SHA-256 fingerprint goes to the server.", "quiet"), input);
  zone.setAttribute("for", "whence-file");
  const answer = hw.el("div");
  answer.id = "whence-answer";
  main.append(hw.section("Where did this come from?", zone), answer);

  for (const ev of ["dragenter", "dragover"]) zone.addEventListener(ev, (e) => { e.preventDefault(); zone.classList.add("over"); });
  zone.addEventListener("dragleave", () => zone.classList.remove("over"));
  zone.addEventListener("drop", (e) => {
    e.preventDefault();
    zone.classList.remove("over");
    if (e.dataTransfer.files.length) lookFor(e.dataTransfer.files[0]);
  });
  input.addEventListener("change", () => { if (input.files.length) lookFor(input.files[0]); });

  async function lookFor(file) {
    answer.replaceChildren(hw.el("p", "Reading " + file.name + "\u2026", "quiet"));
    const digest = await crypto.subtle.digest("SHA-256", await file.arrayBuffer());
    const hex = [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, "0")).join("");
    hw.replaceParams(new URLSearchParams({ sha256: hex }));
    await show("sha256=" + hex, file.name, hex);
  }

  async function show(query, label, hex) {
    let w;
    try {
      w = await hw.get("/api/whence?" + query);
    } catch (e) {
      answer.replaceChildren(hw.el("p", e.message, "notice"));
      return;
    }
    answer.replaceChildren();
    const head = hw.section(label ? "About " + label : "About this dataset", hex ? hw.h("p", "quiet", "SHA-256 ", hw.el("span", hex, "mono")) : null);
    answer.append(head);
    if (!w.datasets.length && !w.producers.length) {
      head.append(hw.el("p", "Unknown: the catalog holds no file with this content, and no run wrote it. It may come from outside the harvested folders, or it changed after it was made.", "verdict unknown"));
      return;
    }
    if (w.datasets.length) {
      head.append(hw.h("p", null, "The catalog knows it as ", ...w.datasets.flatMap((n, i) => [i ? ", " : "", hw.link(hw.datasetByName(n), n, "known-as")]), "."));
    }
    for (const name of w.datasets.slice(0, 3)) preview(head, name);
    if (!w.producers.length) {
      head.append(hw.el("p", "Known, but nothing is recorded about what made it.", "verdict"));
    }
    for (const p of w.producers) head.append(producer(p));
    if (w.upstream.length) {
      const chain = hw.section("Further upstream");
      for (const step of w.upstream) {
        const box = hw.h("div", "step", hw.h("h3", null, step.distance + (step.distance === 1 ? " step" : " steps") + " up: ", hw.link(hw.datasetByName(step.dataset), step.dataset)));
        for (const p of step.producers) box.append(producer(p));
        if (!step.producers.length) box.append(hw.el("p", "Nothing known made it: a starting point.", "quiet"));
        chain.append(box);
      }
      answer.append(chain);
    }
  }

  /** A figure the file is known as gets its picture shown, from the harvested copy. */
  async function preview(into, name) {
    const found = await hw.get("/api/datasets?match=" + encodeURIComponent(name)).catch(() => ({ items: [] }));
    const d = found.items.find((x) => x.name === name);
    if (!d || d.kind !== "figure" || d.format === "pdf") return;
    const img = hw.el("img", null, "figure thumb");
    img.alt = "Preview of " + name;
    img.src = "/api/ui/figure/" + d.id;
    img.addEventListener("error", () => img.remove());
    into.append(img);
  }

  function producer(p) {
    const box = hw.h("div", "producer", hw.h("p", null, "Made by ", hw.link(hw.scriptByName(p.script), p.script, "producer-script"),
      hw.el("span", " (" + p.evidence + ", matched by " + p.matched_by + ")", "quiet")));
    if (p.run) {
      const r = p.run;
      box.append(hw.facts([["Run", r.id], ["Started", hw.when(r.started_at)], ["Ended", hw.when(r.ended_at)], ["User", r.user], ["Host", r.host],
        ["Commit", r.git_commit], ["Arguments", Array.isArray(r.args) ? r.args.join(" ") : null], ["Exit", r.exit_code === null ? r.exception : String(r.exit_code)]]));
    }
    if (p.inputs.length) {
      box.append(hw.h("p", null, "from: ", ...p.inputs.flatMap((i, k) => [k ? ", " : "", hw.link(hw.datasetByName(i.dataset), i.dataset)])));
    }
    return box;
  }

  const p = route.params;
  if (p.get("sha256")) await show("sha256=" + encodeURIComponent(p.get("sha256")), null, p.get("sha256"));
  else if (p.get("dataset")) await show("dataset=" + encodeURIComponent(p.get("dataset")), null, null);
};
