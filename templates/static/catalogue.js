// factsheet — sorting and filtering of the catalogue table on the index page.
// The table is plain HTML and complete without this script; the script only adds the
// controls: sortable column headers, a text filter, status and class filters, and a count.
// The filter and the sort live in the page address after "#" (q, status, class, sort, order),
// so a filtered view can be shared as a link and is restored on load; a fragment works from
// file:// and on any host, and never reaches a server. When no row matches, the table says so
// and offers a control that clears the filter.
// The words of the controls are the page's, in its language: the table's data-ui-* attributes
// (placeholders in braces, e.g. "{shown}", filled in here); a filter's choices are written as
// the table's cells write them.
"use strict";

(function () {
  const table = document.getElementById("catalogue");
  if (!table || !table.tBodies.length) {
    return;
  }
  const body = table.tBodies[0];
  const rows = Array.from(body.rows);
  const headers = Array.from(table.tHead.rows[0].cells);
  const ui = table.dataset;

  // The page's words for `name` (a data-ui-* attribute), with {placeholders} filled in.
  function uiText(name, values) {
    return (ui[name] || "").replace(/\{(\w+)\}/g, function (whole, key) {
      return values && key in values ? String(values[key]) : whole;
    });
  }

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

  function sortBy(column, header, direction) {
    const ascending = direction ? direction === "ascending" :
      header.getAttribute("aria-sort") !== "ascending";
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
    button.setAttribute("aria-label", uiText("uiSort", { column: label }));
    button.addEventListener("click", function () { sortBy(column, header); save(); });
    header.textContent = "";
    header.append(button);
  });

  // Filtering -------------------------------------------------------------------------
  // A value as the table shows it: the text of its column's cell (a status in words).
  function shownAs(attribute, value) {
    const column = headers.findIndex(function (th) { return th.dataset.key === attribute; });
    const row = rows.find(function (r) { return r.dataset[attribute] === value; });
    return (column >= 0 && row && row.cells[column].textContent.trim()) || value;
  }

  function options(attribute, allLabel) {
    const values = Array.from(new Set(rows.map(function (row) {
      return row.dataset[attribute] || "";
    }).filter(Boolean))).sort();
    return [make("option", { value: "", textContent: allLabel })].concat(
      values.map(function (value) {
        return make("option", { value: value, textContent: shownAs(attribute, value) });
      })
    );
  }

  function labelled(text, control, id) {
    control.id = id;
    return make("span", { className: "control" }, [make("label", { htmlFor: id, textContent: text }), control]);
  }

  const search = make("input", { type: "search", autocomplete: "off", placeholder: uiText("uiPlaceholder") });
  const status = make("select", {}, options("status", uiText("uiAllStatuses")));
  const kind = make("select", {}, options("class", uiText("uiAllClasses")));
  const count = make("p", { className: "count" });
  count.setAttribute("aria-live", "polite");

  function update() {
    const words = search.value.trim().toLowerCase().split(/\s+/).filter(Boolean);
    rows.forEach(function (row) {
      const text = row.textContent.toLowerCase();
      const match = words.every(function (w) { return text.includes(w); }) &&
        (!status.value || row.dataset.status === status.value) &&
        (!kind.value || row.dataset.class === kind.value);
      row.hidden = !match;
    });
    const shown = shownCount();
    // one form for a single event, the other for any other number
    count.textContent = uiText(rows.length === 1 ? "uiCountOne" : "uiCountOther",
      { shown: shown, total: rows.length });
  }

  // No match: one row across the table, with a control that clears the filter.
  const clear = make("button", { type: "button", className: "clear-filter" }, [uiText("uiClear")]);
  const message = uiText("uiNoMatch").split("{clear}");
  const empty = make("td", { colSpan: headers.length },
    message.flatMap(function (part, index) { return index ? [clear, part] : [part]; })
      .filter(function (part) { return part !== ""; }));
  const emptyBody = make("tfoot", { className: "no-match", hidden: true }, [make("tr", {}, [empty])]);
  table.append(emptyBody);

  function shownCount() {
    const shown = rows.filter(function (row) { return !row.hidden; }).length;
    emptyBody.hidden = shown > 0;
    return shown;
  }

  // The state in the address: #q=...&status=...&class=...&sort=<column key>&order=desc
  function state() {
    const params = new URLSearchParams();
    [["q", search.value.trim()], ["status", status.value], ["class", kind.value]].forEach(
      function (pair) { if (pair[1]) { params.set(pair[0], pair[1]); } });
    const sorted = headers.find(function (th) { return th.hasAttribute("aria-sort"); });
    if (sorted && sorted.dataset.key) {
      params.set("sort", sorted.dataset.key);
      if (sorted.getAttribute("aria-sort") === "descending") { params.set("order", "desc"); }
    }
    return params.toString();
  }

  function save() {
    const text = state();
    const target = text ? "#" + text : location.pathname + location.search;
    if (("#" + text) === location.hash || (!text && !location.hash)) {
      return;
    }
    try {
      history.replaceState(null, "", target);
    } catch (error) {  // some browsers refuse it for file:// pages
      location.replace("#" + text);
    }
  }

  function choose(select, value) {
    select.value = Array.from(select.options).some(function (o) { return o.value === value; }) ?
      value : "";
  }

  function restore() {
    const params = new URLSearchParams(location.hash.replace(/^#/, ""));
    search.value = params.get("q") || "";
    choose(status, params.get("status") || "");
    choose(kind, params.get("class") || "");
    const column = headers.findIndex(function (th) { return th.dataset.key === params.get("sort"); });
    if (column >= 0) {
      sortBy(column, headers[column], params.get("order") === "desc" ? "descending" : "ascending");
    }
    update();
  }

  [search, status, kind].forEach(function (control) {
    control.addEventListener(control === search ? "input" : "change", function () {
      update();
      save();
    });
  });
  clear.addEventListener("click", function () {
    search.value = "";
    status.value = "";
    kind.value = "";
    update();
    save();
    search.focus();
  });
  window.addEventListener("hashchange", restore);

  const controls = make("div", { className: "table-controls" }, [
    labelled(uiText("uiFilter"), search, "catalogue-filter"),
    labelled(uiText("uiStatus"), status, "catalogue-status"),
    labelled(uiText("uiClass"), kind, "catalogue-class"),
    count,
  ]);
  controls.setAttribute("role", "search");
  const wrap = document.getElementById("catalogue-wrap") || table;
  wrap.parentNode.insertBefore(controls, wrap);
  restore();
})();
