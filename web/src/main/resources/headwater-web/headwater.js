// Shared helpers of the Headwater pages. Every value from the catalog is put on the page as text
// (textContent), never as HTML, because names, columns and descriptions come from files people made.
"use strict";

const hw = {
  async get(path) {
    const response = await fetch(path, { headers: { Accept: "application/json" } });
    const body = await response.json().catch(() => ({}));
    if (!response.ok) {
      throw new Error(body.message || ("The server answered " + response.status));
    }
    return body;
  },
  el(tag, text, className) {
    const node = document.createElement(tag);
    if (text !== undefined && text !== null) node.textContent = String(text);
    if (className) node.className = className;
    return node;
  },
  link(href, text) {
    const a = hw.el("a", text);
    a.href = href;
    return a;
  },
  datasetHref(id) {
    return "/dataset.html?id=" + encodeURIComponent(id);
  },
};
