// factsheet — the catalogue table on the index page: sorting, filtering and paging.
// The page's HTML holds the first rows of the table (every row of a small catalogue) and reads
// without this script. Every row is in index-rows.js beside the page, loaded before this
// script by a <script src> (so it loads from file:// as over http, where a fetch would be
// refused), as data: the texts the cells show and the values they sort by. The script sorts and
// filters those arrays in memory and writes one page of rows into the table, so the page holds
// a hundred rows whatever the size of the catalogue.
// It adds sortable column headers, a text filter, status and class filters, a count (a live
// region) and, when the catalogue has more rows than a page, a pager above and below the table.
// The filter, the sort and the page live in the page address after "#" (q, status, class,
// sort, order, page), so a view can be shared as a link and is restored on load; a fragment
// works from file:// and on any host, and never reaches a server. When no row matches, the
// table says so and offers a control that clears the filter.
// The words of the controls are the page's, in its language: the table's data-ui-* attributes
// (placeholders in braces, e.g. "{shown}", filled in here); the words of the rows come with
// the rows, and a row is written as the page's HTML writes it (templates/index.html).
"use strict";

(function () {
  const table = document.getElementById("catalogue");
  const data = window.factsheetIndexRows;
  if (!table || !table.tBodies.length || !data || !Array.isArray(data.rows)) {
    return;  // no data: the rows of the HTML stay as they are
  }
  const body = table.tBodies[0];
  const headers = Array.from(table.tHead.rows[0].cells);
  const ui = table.dataset;
  const words = data.words;
  const rows = data.rows;
  const pageSize = data.page_size > 0 ? data.page_size : 100;
  const paged = rows.length > pageSize;
  const F = {};  // field name -> index in a row
  data.fields.forEach(function (name, index) { F[name] = index; });
  const NUMBERS = ["heavier_mass", "lighter_mass", "remnant_mass", "energy_radiated", "distance"];

  // The page's words for `name` (a data-ui-* attribute), with {placeholders} filled in.
  function uiText(name, values) {
    return (ui[name] || "").replace(/\{(\w+)\}/g, function (whole, key) {
      return values && key in values ? String(values[key]) : whole;
    });
  }

  // A count as the page writes its numbers: the language's group sign from a length on.
  function digits(n) {
    const text = String(n);
    if (text.length < data.digits.min_digits) {
      return text;
    }
    const head = text.length % 3 || 3;
    const groups = [text.slice(0, head)];
    for (let i = head; i < text.length; i += 3) { groups.push(text.slice(i, i + 3)); }
    return groups.join(data.digits.group);
  }

  function make(tag, props, children) {
    const node = document.createElement(tag);
    Object.assign(node, props || {});
    (children || []).forEach(function (child) { node.append(child); });
    return node;
  }

  // Rows ------------------------------------------------------------------------------
  const ESCAPES = { "&": "&amp;", "<": "&lt;", ">": "&gt;", "\"": "&quot;", "'": "&#39;" };
  function esc(text) {
    return String(text).replace(/[&<>"']/g, function (c) { return ESCAPES[c]; });
  }

  function statusWord(status) {
    return words.status[status] || status;
  }

  function numberCell(value, none) {
    return value ?
      "<td class=\"num\" data-sort=\"" + value[1] + "\">" + esc(value[0]) + "</td>" :
      "<td class=\"num none\" data-sort=\"\">—<span class=\"visually-hidden\"> " + esc(none) +
        "</span></td>";
  }

  // One row, as templates/index.html writes it.
  function rowHtml(row) {
    const id = esc(row[F.id]);
    const status = esc(row[F.status]);
    const word = esc(statusWord(row[F.status]));
    const kind = row[F.class];
    const title = esc(row[F.title]);
    const date = esc(row[F.date]);
    const sky = row[F.sky];
    let html = "<tr class=\"status-" + status + "\" data-status=\"" + status +
      "\" data-class=\"" + esc(kind) + "\"><th scope=\"row\" data-sort=\"" + id + "\"><a href=\"" +
      esc(row[F.href]) + "\">" + id + "</a>";
    if (row[F.status] !== "confirmed") {
      html += " <span class=\"badge badge-" + status + "\">" + word + "</span>";
    }
    if (row[F.withheld]) {
      html += " <span class=\"badge badge-internal\">" + esc(row[F.withheld]) + "</span>";
    }
    html += "<br><span class=\"sub\">" + (row[F.title_lang] ?
      "<span lang=\"" + esc(row[F.title_lang]) + "\">" + title + "</span>" : title) +
      "</span></th><td class=\"num\"><time datetime=\"" + date + "\">" + date + "</time></td><td>" +
      (words.classes[kind] ?
        "<abbr title=\"" + esc(words.classes[kind]) + "\">" + esc(kind) + "</abbr>" : esc(kind)) +
      "</td>";
    NUMBERS.forEach(function (name) { html += numberCell(row[F[name]], words.not_computed); });
    if (sky) {
      const alt = words.sky_alt.replace("{event}", row[F.id]).replace("{area}", sky[0]);
      html += "<td class=\"num sky-cell\" data-sort=\"" + sky[1] + "\">" + (row[F.sky_thumbnail] ?
        "<img class=\"sky-thumb\" src=\"" + esc(row[F.sky_thumbnail]) + "\" alt=\"" + esc(alt) +
        "\" width=\"96\" height=\"54\" loading=\"lazy\"><br>" : "") + esc(sky[0]) + "</td>";
    } else {
      html += numberCell(null, words.not_given);
    }
    return html + "<td data-sort=\"" + status + "\"><span class=\"badge badge-" + status + "\">" +
      word + "</span></td><td>" + esc(row[F.bands]) + "</td></tr>";
  }

  // What the filter searches in a row: the words its cells show, in lower case.
  let texts = null;
  function searchable(index) {
    if (!texts) {
      texts = rows.map(function (row) {
        const status = statusWord(row[F.status]);
        const parts = [row[F.id], row[F.status] !== "confirmed" ? status : "", row[F.withheld],
          row[F.title], row[F.date], row[F.class]];
        NUMBERS.forEach(function (name) {
          const value = row[F[name]];
          parts.push(value ? value[0] : "— " + words.not_computed);
        });
        parts.push(row[F.sky] ? row[F.sky][0] : "— " + words.not_given, status, row[F.bands]);
        return parts.join("\n").toLowerCase();
      });
    }
    return texts[index];
  }

  // Sorting ---------------------------------------------------------------------------
  // A column's sort values, one per row (NaN: no value, sorted last in either direction):
  // the number of a numeric cell, or the rank of a text among the column's texts (compared
  // with numbers in them read as numbers). Made once per column, when it is first sorted.
  const collator = new Intl.Collator(undefined, { numeric: true });
  const sortValues = {};
  function valuesOf(key) {
    if (sortValues[key]) {
      return sortValues[key];
    }
    const values = new Float64Array(rows.length).fill(NaN);
    const index = key in F ? F[key] : -1;
    if (index < 0) {
      return (sortValues[key] = values);
    }
    if (key === "sky" || NUMBERS.indexOf(key) >= 0) {
      rows.forEach(function (row, i) { if (row[index]) { values[i] = row[index][1]; } });
    } else {
      const text = rows.map(function (row) { return String(row[index] || "").trim(); });
      const order = [];
      text.forEach(function (t, i) { if (t !== "") { order.push(i); } });
      order.sort(function (a, b) { return collator.compare(text[a], text[b]); });
      let rank = 0;
      order.forEach(function (i, position) {
        if (position && collator.compare(text[order[position - 1]], text[i]) !== 0) {
          rank = position;
        }
        values[i] = rank;
      });
    }
    return (sortValues[key] = values);
  }

  let order = rows.map(function (row, index) { return index; });  // rows in the sorted order
  let view = order;  // the rows that match the filter, in that order
  let page = 1;

  // A column's rows in ascending order (ties in the catalogue's order), then the rows without
  // a value: made once per column; either direction is then read off it in one pass.
  const ascendingOrders = {};
  function ascendingOrder(key) {
    if (!ascendingOrders[key]) {
      const values = valuesOf(key);
      const filled = [];
      const empty = [];
      for (let i = 0; i < rows.length; i += 1) {
        (values[i] === values[i] ? filled : empty).push(i);
      }
      filled.sort(function (a, b) { return values[a] - values[b] || a - b; });
      ascendingOrders[key] = { filled: filled, empty: empty };
    }
    return ascendingOrders[key];
  }

  function sortBy(column, header, direction) {
    const ascending = direction ? direction === "ascending" :
      header.getAttribute("aria-sort") !== "ascending";
    const key = header.dataset.key;
    const sorted = ascendingOrder(key);
    if (ascending) {
      order = sorted.filled.concat(sorted.empty);
    } else {  // runs of equal values from the last, each run still in the catalogue's order
      const values = valuesOf(key);
      const filled = sorted.filled;
      order = [];
      let end = filled.length;
      while (end > 0) {
        let start = end - 1;
        while (start > 0 && values[filled[start - 1]] === values[filled[end - 1]]) { start -= 1; }
        for (let i = start; i < end; i += 1) { order.push(filled[i]); }
        end = start;
      }
      order = order.concat(sorted.empty);  // no value: last in either direction
    }
    headers.forEach(function (th) { th.removeAttribute("aria-sort"); });
    header.setAttribute("aria-sort", ascending ? "ascending" : "descending");
  }

  headers.forEach(function (header, column) {
    const label = header.textContent.trim();
    const button = make("button", { type: "button", className: "sort" }, [label]);
    button.setAttribute("aria-label", uiText("uiSort", { column: label }));
    button.addEventListener("click", function () {
      sortBy(column, header);
      filter();
      page = 1;
      render();
      save();
    });
    header.textContent = "";
    header.append(button);
  });

  // Filtering -------------------------------------------------------------------------
  function options(field, allLabel, shownAs) {
    const values = Array.from(new Set(rows.map(function (row) {
      return row[F[field]] || "";
    }).filter(Boolean))).sort();
    return [make("option", { value: "", textContent: allLabel })].concat(
      values.map(function (value) {
        return make("option", { value: value, textContent: shownAs(value) });
      })
    );
  }

  function labelled(text, control, id) {
    control.id = id;
    return make("span", { className: "control" }, [make("label", { htmlFor: id, textContent: text }), control]);
  }

  const search = make("input", { type: "search", autocomplete: "off", placeholder: uiText("uiPlaceholder") });
  // a filter's choices read as the table's cells write them
  const status = make("select", {}, options("status", uiText("uiAllStatuses"), statusWord));
  const kind = make("select", {}, options("class", uiText("uiAllClasses"), String));
  const count = make("p", { className: "count" });
  count.setAttribute("aria-live", "polite");

  function filter() {
    const terms = search.value.trim().toLowerCase().split(/\s+/).filter(Boolean);
    const wanted = status.value;
    const wantedKind = kind.value;
    if (!terms.length && !wanted && !wantedKind) {
      view = order;
      return;
    }
    view = order.filter(function (index) {
      const row = rows[index];
      if ((wanted && row[F.status] !== wanted) || (wantedKind && row[F.class] !== wantedKind)) {
        return false;
      }
      const text = searchable(index);
      return terms.every(function (term) { return text.includes(term); });
    });
  }

  // No match: one row across the table, with a control that clears the filter.
  const clear = make("button", { type: "button", className: "clear-filter" }, [uiText("uiClear")]);
  const message = uiText("uiNoMatch").split("{clear}");
  const empty = make("td", { colSpan: headers.length },
    message.flatMap(function (part, index) { return index ? [clear, part] : [part]; })
      .filter(function (part) { return part !== ""; }));
  const emptyBody = make("tfoot", { className: "no-match", hidden: true }, [make("tr", {}, [empty])]);
  table.append(emptyBody);

  // Paging ----------------------------------------------------------------------------
  function pages() {
    return Math.max(1, Math.ceil(view.length / pageSize));
  }

  function makePager(place) {
    const pager = make("nav", { className: "table-pager table-pager-" + place });
    pager.setAttribute("aria-label", uiText("uiPages"));
    pager.buttons = {};
    pager.range = make("span", { className: "range" });
    [["first", "uiFirst"], ["previous", "uiPrevious"], ["next", "uiNext"], ["last", "uiLast"]]
      .forEach(function (pair) {
        const button = make("button", { type: "button", className: "page-" + pair[0] },
          [uiText(pair[1])]);
        button.addEventListener("click", function () { turn(pair[0], place); });
        pager.buttons[pair[0]] = button;
      });
    pager.append(pager.buttons.first, pager.buttons.previous, pager.range, pager.buttons.next,
      pager.buttons.last);
    return pager;
  }

  const top = paged ? makePager("top") : null;
  const bottom = paged ? makePager("bottom") : null;

  function turn(where, place) {
    page = { first: 1, previous: page - 1, next: page + 1, last: pages() }[where];
    render();
    save();
    // The new rows start at the top of the table: keyboard focus goes to the pager above it
    // (a control that became disabled hands focus to the one going the other way).
    let target = top.buttons[where];
    if (target.disabled) {
      target = top.buttons[where === "next" || where === "last" ? "previous" : "next"];
    }
    if (place === "bottom" || target !== top.buttons[where]) {
      target.focus();
    }
  }

  function render() {
    page = Math.min(Math.max(1, page | 0), pages());
    const start = (page - 1) * pageSize;
    const shown = view.slice(start, start + pageSize);
    body.innerHTML = shown.map(function (index) { return rowHtml(rows[index]); }).join("");
    emptyBody.hidden = view.length > 0;
    // one form for a single event, the other for any other number
    count.textContent = uiText(rows.length === 1 ? "uiCountOne" : "uiCountOther",
      { shown: digits(view.length), total: digits(rows.length) });
    [top, bottom].forEach(function (pager) {
      if (!pager) {
        return;
      }
      pager.range.textContent = view.length ? uiText("uiRange", {
        first: digits(start + 1), last: digits(start + shown.length), shown: digits(view.length),
      }) : "";
      pager.buttons.first.disabled = pager.buttons.previous.disabled = page <= 1;
      pager.buttons.next.disabled = pager.buttons.last.disabled = page >= pages();
    });
  }

  // The state in the address: #q=...&status=...&class=...&sort=<column key>&order=desc&page=2
  function state() {
    const params = new URLSearchParams();
    [["q", search.value.trim()], ["status", status.value], ["class", kind.value]].forEach(
      function (pair) { if (pair[1]) { params.set(pair[0], pair[1]); } });
    const sorted = headers.find(function (th) { return th.hasAttribute("aria-sort"); });
    if (sorted && sorted.dataset.key) {
      params.set("sort", sorted.dataset.key);
      if (sorted.getAttribute("aria-sort") === "descending") { params.set("order", "desc"); }
    }
    if (page > 1) { params.set("page", String(page)); }
    return params.toString();
  }

  // The address follows the view a moment after it changes: replacing a history entry costs
  // more than drawing a page of rows, and typing in the filter replaces it once, not per key.
  let saving = 0;
  function save() {
    clearTimeout(saving);
    saving = setTimeout(saveNow, 150);
  }

  function saveNow() {
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
    } else {
      order = rows.map(function (row, index) { return index; });
      headers.forEach(function (th) { th.removeAttribute("aria-sort"); });
    }
    filter();
    page = Number(params.get("page")) || 1;
    render();
  }

  [search, status, kind].forEach(function (control) {
    control.addEventListener(control === search ? "input" : "change", function () {
      filter();
      page = 1;
      render();
      save();
    });
  });
  clear.addEventListener("click", function () {
    search.value = "";
    status.value = "";
    kind.value = "";
    filter();
    page = 1;
    render();
    save();
    search.focus();
  });
  window.addEventListener("hashchange", function () {
    if (location.hash.replace(/^#/, "") !== state()) {
      clearTimeout(saving);
      restore();
    }
  });
  window.addEventListener("pagehide", function () {  // a view changed just before leaving
    clearTimeout(saving);
    saveNow();
  });

  const controls = make("div", { className: "table-controls" }, [
    labelled(uiText("uiFilter"), search, "catalogue-filter"),
    labelled(uiText("uiStatus"), status, "catalogue-status"),
    labelled(uiText("uiClass"), kind, "catalogue-class"),
    count,
  ]);
  controls.setAttribute("role", "search");
  const wrap = document.getElementById("catalogue-wrap") || table;
  wrap.parentNode.insertBefore(controls, wrap);
  if (paged) {
    top.range.setAttribute("aria-live", "polite");
    wrap.parentNode.insertBefore(top, wrap);
    wrap.parentNode.insertBefore(bottom, wrap.nextSibling);
  }
  const note = document.getElementById("catalogue-partial");
  if (note) {
    note.hidden = true;  // every row is reachable here: the note is for readers without script
  }
  restore();
  // What the first filter and the first sort of each column would make: made while the reader
  // looks at the page, so that those are as quick as the later ones.
  const later = window.requestIdleCallback || function (task) { return setTimeout(task, 200); };
  const columns = headers.map(function (th) { return th.dataset.key; });
  function prepare() {  // one column at a time, so that a click never waits long
    if (!texts) {
      searchable(0);
    } else if (columns.length) {
      ascendingOrder(columns.shift());
    } else {
      return;
    }
    later(prepare);
  }
  later(prepare);
})();
