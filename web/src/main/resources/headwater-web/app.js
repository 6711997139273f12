// The router: every view has its own address (#/name/arguments?options), so views can be bookmarked
// and the back button works. A view is a function (main, route) that may return a cleanup function.
"use strict";

(function () {
  const main = document.getElementById("view");
  let cleanup = null;

  async function show() {
    const route = hw.route();
    const name = route.parts[0] || "find";
    if (cleanup) cleanup();
    cleanup = null;
    main.replaceChildren();
    for (const a of document.querySelectorAll(".ways a")) {
      a.classList.toggle("here", a.dataset.view === name);
    }
    const view = hw.views[name];
    if (!view) {
      main.append(hw.section("No such page", hw.el("p", "This address names no page of Headwater."), hw.link("#/", "Back to the start")));
      return;
    }
    try {
      cleanup = (await view(main, route)) || null;
    } catch (e) {
      main.append(hw.section("Something went wrong", hw.el("p", e.message, "notice")));
    }
  }

  window.addEventListener("hashchange", show);
  hw.get("/api/health").then((h) => {
    document.getElementById("version").textContent = "version " + h.version;
  }).catch(() => {});
  show();
})();
