// Up to date?: every freshness check with its state, since when and why; filter to the late and stale.
"use strict";

hw.views.freshness = async function (main, route) {
  const show = route.params.get("show") || "all";
  const filters = hw.h("p", "actions", ...[["all", "All"], ["late", "Late and stale"]].map(([v, label]) => {
    const a = hw.link("#/freshness" + (v === "all" ? "" : "?show=" + v), label, "button" + (show === v ? " on" : ""));
    return a;
  }));
  const box = hw.section("Up to date?", filters);
  main.append(box);
  let answer;
  try {
    answer = await hw.optional("/api/freshness");
  } catch (e) {
    box.append(hw.el("p", e.message, "notice"));
    return;
  }
  if (answer === null) {
    box.append(hw.notAvailable("Freshness checking"));
    return;
  }
  box.append(hw.h("ul", "chips counts", ...Object.entries(answer.counts || {}).map(([k, n]) => hw.h("li", null, hw.el("span", k, "state state-" + k), " " + n))));
  const checks = answer.checks.filter((c) => show === "all" || c.state === "late" || c.state === "stale");
  if (!checks.length) {
    box.append(hw.el("p", show === "all" ? "No freshness rules are set." : "Nothing is late or stale.", "quiet"));
    return;
  }
  box.append(hw.table(["Dataset", "State", "Since", "Why", "Rule", "Newer input"], checks.map((c) => [
    hw.link(hw.datasetHref(c.datasetId ?? c.dataset_id), c.name), hw.el("span", c.state, "state state-" + c.state), hw.when(c.since), c.why || "",
    typeof c.policy === "string" ? c.policy : c.policy ? JSON.stringify(c.policy) : "", (c.newerInput ?? c.newer_input) || ""]), "freshness"));
};
