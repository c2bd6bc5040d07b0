// factsheet — sorting and filtering of the catalogue table on the index page.
// The table is plain HTML and complete without this script; the script only adds the
// controls: sortable column headers, a text filter, status and class filters, and a count.
"use strict";

(function () {
  const table = document.getElementById("catalogue");
  if (!table || !table.tBodies.length) {
    return;
  }
  const body = table.tBodies[0];
  const rows = Array.from(body.rows);
  const headers = Array.from(table.tHead.rows[0].cells);

  function make(tag, props, children) {
    const node = document.createElement(tag);
    Object.assign(node, props || {});
    (children || []).forEach(function (child) { node.append(child); });
    return node;
  }

  // Sorting ---------------------------------------------------------------------------
  function sortKey(row, column) {
    const cell = row.cells[column];
    const raw = cell.dataset.sort !== undefined ? cell.dataset.sort : cell.textContent;
    return raw.trim();
  }

  function isNumeric(column) {
    return rows.some(function (row) {
      const cell = row.cells[column];
      return cell.classList.contains("num") && cell.dataset.sort && isFinite(cell.dataset.sort);
    });
  }

  function compare(a, b, numeric) {
    if (a === "" || b === "") {  // empty values go last in either direction
      return (a === "") - (b === "");
    }
    return numeric ? Number(a) - Number(b) : a.localeCompare(b, undefined, { numeric: true });
  }

  function sortBy(column, header) {
    const ascending = header.getAttribute("aria-sort") !== "ascending";
    const numeric = isNumeric(column);
    const keyed = rows.map(function (row, index) {
      return { row: row, key: sortKey(row, column), index: index };
    });
    keyed.sort(function (x, y) {
      if (x.key === "" || y.key === "") {
        return compare(x.key, y.key, numeric) || x.index - y.index;
      }
      const order = compare(x.key, y.key, numeric);
      return (ascending ? order : -order) || x.index - y.index;
    });
    keyed.forEach(function (item) { body.appendChild(item.row); });
    headers.forEach(function (th) { th.removeAttribute("aria-sort"); });
    header.setAttribute("aria-sort", ascending ? "ascending" : "descending");
  }

  headers.forEach(function (header, column) {
    const label = header.textContent.trim();
    const button = make("button", { type: "button", className: "sort" }, [label]);
    button.setAttribute("aria-label", "Sort by " + label);
    button.addEventListener("click", function () { sortBy(column, header); });
    header.textContent = "";
    header.append(button);
  });

  // Filtering -------------------------------------------------------------------------
  function options(attribute, allLabel) {
    const values = Array.from(new Set(rows.map(function (row) {
      return row.dataset[attribute] || "";
    }).filter(Boolean))).sort();
    return [make("option", { value: "", textContent: allLabel })].concat(
      values.map(function (value) { return make("option", { value: value, textContent: value }); })
    );
  }

  function labelled(text, control, id) {
    control.id = id;
    return make("span", { className: "control" }, [make("label", { htmlFor: id, textContent: text }), control]);
  }

  const search = make("input", { type: "search", autocomplete: "off", placeholder: "designation, title, class…" });
  const status = make("select", {}, options("status", "all statuses"));
  const kind = make("select", {}, options("class", "all classes"));
  const count = make("p", { className: "count" });
  count.setAttribute("aria-live", "polite");

  function update() {
    const words = search.value.trim().toLowerCase().split(/\s+/).filter(Boolean);
    let shown = 0;
    rows.forEach(function (row) {
      const text = row.textContent.toLowerCase();
      const match = words.every(function (w) { return text.includes(w); }) &&
        (!status.value || row.dataset.status === status.value) &&
        (!kind.value || row.dataset.class === kind.value);
      row.hidden = !match;
      shown += match ? 1 : 0;
    });
    count.textContent = shown + " of " + rows.length + " events shown";
  }

  [search, status, kind].forEach(function (control) {
    control.addEventListener(control === search ? "input" : "change", update);
  });

  const controls = make("div", { className: "table-controls" }, [
    labelled("Filter", search, "catalogue-filter"),
    labelled("Status", status, "catalogue-status"),
    labelled("Class", kind, "catalogue-class"),
    count,
  ]);
  controls.setAttribute("role", "search");
  const wrap = document.getElementById("catalogue-wrap") || table;
  wrap.parentNode.insertBefore(controls, wrap);
  update();
})();
