"use strict";

(function () {
  const input = document.getElementById("q");
  const hits = document.getElementById("hits");
  const results = document.getElementById("results");
  const title = document.getElementById("results-title");
  let pending = 0;

  async function showCounts() {
    try {
      const health = await hw.get("/api/health");
      document.getElementById("counts").textContent =
        health.datasets + " datasets and " + health.scripts + " scripts are catalogued.";
    } catch (e) {
      document.getElementById("counts").textContent = "The catalog did not answer: " + e.message;
    }
  }

  async function search(text) {
    const ticket = ++pending;
    if (!text.trim()) {
      results.hidden = true;
      return;
    }
    try {
      const answer = await hw.get("/api/search?q=" + encodeURIComponent(text) + "&limit=30");
      if (ticket !== pending) return; // a newer keystroke already asked
      hits.replaceChildren();
      title.textContent = answer.hits.length ? "Results for \u201c" + text + "\u201d" : "Nothing matches \u201c" + text + "\u201d";
      for (const hit of answer.hits) {
        const item = hw.el("li");
        item.append(hw.el("span", hit.kind, "tag"));
        if (hit.kind === "script") {
          item.append(hw.el("strong", hit.name));
        } else {
          item.append(hw.link(hw.datasetHref(hit.id), hit.name));
        }
        if (hit.format) item.append(hw.el("span", "  " + hit.format, "quiet"));
        hits.append(item);
      }
      results.hidden = false;
    } catch (e) {
      title.textContent = e.message;
      hits.replaceChildren();
      results.hidden = false;
    }
  }

  let timer;
  input.addEventListener("input", () => {
    clearTimeout(timer);
    timer = setTimeout(() => {
      history.replaceState(null, "", input.value ? "/?q=" + encodeURIComponent(input.value) : "/");
      search(input.value);
    }, 120);
  });
  document.getElementById("find").addEventListener("submit", (event) => {
    event.preventDefault();
    search(input.value);
  });

  const initial = new URLSearchParams(location.search).get("q");
  if (initial) {
    input.value = initial;
    search(initial);
  }
  showCounts();
})();
