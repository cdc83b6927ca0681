// Setcard page script: the form, the required-set table, projects, units,
// printing and the bridge to the chart program in <iframe id="chart-frame">.
//
// The Go program (setcard.wasm, started by chart.js inside the iframe) owns
// every engineering number. It registers globalThis.setcardCore in the
// iframe's window and calls back through window.setcardHost, defined below:
//
//   setcardHost.coreReady()              the core is registered
//   setcardHost.coreFailed(message)      the chart program could not start
//   setcardHost.controlChanged(project)  an on-canvas control moved (JSON)
//   setcardHost.firstDraw()              the first chart frame is drawn
//   setcardHost.noCanvas(message)        the canvas could not start although
//                                        WebGL was found: show the SVG chart
//   setcardHost.leaveCanvas()            Escape gave the keyboard back
//   setcardHost.leaveChart(backwards)    optional: move focus out of the
//                                        chart to the next (or previous)
//                                        control of the page
//
// Test hook, read only: window.setcard
//
//   window.setcard.ready    true once the first chart of the page's project
//                           is drawn (firstDraw received and a frame drawn
//                           after the project was applied; without WebGL,
//                           once the SVG chart is shown).
//   window.setcard.state()  {project, rows, controls, timings}:
//                           project   the current setcard/1 project object
//                                     (core.project()),
//                           rows      the required-set rows exactly as
//                                     `setcard table -json` gives them,
//                           controls  the on-canvas controls [{name, value,
//                                     unit, x, y, w, h, selected}] with x, y
//                                     in CSS pixels of the page's viewport
//                                     (the iframe's offset added), ready for
//                                     mouse and touch events,
//                           timings   {update_ms, draw_ms, recompute_ms}.
//                           It reads; it never changes anything.
//
// No framework and no build step: plain ES2020. Every asset is named by its
// plain file name in a string literal so that scripts/build can give it its
// content-hashed name.
"use strict";

(function () {
  // ---------------------------------------------------------------------
  // Bridge: defined first, so that the Go program finds it.

  window.setcardHost = Object.freeze({
    coreReady: () => onCoreReady(),
    coreFailed: (message) => onCoreFailed(String(message)),
    controlChanged: (projectJSON) => onControlChanged(String(projectJSON)),
    firstDraw: () => onFirstDraw(),
    noCanvas: (message) => onNoCanvas(String(message)),
    leaveCanvas: () => onLeaveCanvas(),
    leaveChart: (backwards) => leaveChart(Boolean(backwards)),
  });

  // ---------------------------------------------------------------------
  // Constants.

  const FORMAT = "setcard/1";

  // The demo project of testdata/demo.json (invented data).
  const DEMO = {
    format: "setcard/1",
    name: "Demo: lakeside boardwalk, timber bearing piles (invented)",
    hammer: { type: "drop-winch", ram_kg: 500, efficiency: 0.8, restitution: 0.25 },
    drops_m: [0.6, 0.9, 1.2, 1.5],
    pile: {
      material: "timber", diameter_mm: 250, length_m: 6, length_max_m: 9,
      length_step_m: 1.5, density_kg_m3: 900, modulus_mpa: 9000,
    },
    driven_parts_kg: 45,
    compression: { method: "interpolated", cap: ["timber-head", "timber-dolly"], cq_mm: 2.5 },
    design: { load_kn: 100, phi: 0.5 },
    min_set_mm_per_blow: 1.5,
    card: {
      reference: "DEMO-SC-01", date: "2026-12-01", revision: "A",
      prepared_by: "A. Example", checked_by: "", approved_by: "",
    },
  };

  // The core's limits (calc/model.go), used until core.limits() answers and
  // for any key it does not give.
  const FALLBACK_LIMITS = {
    "hammer.ram_kg": { min: 50, max: 20000, unit: "kg" },
    "hammer.efficiency": { min: 0.3, max: 1, unit: "" },
    "hammer.restitution": { min: 0, max: 0.9, unit: "" },
    "drops_m": { min: 0.05, max: 5, unit: "m" },
    "pile.diameter_mm": { min: 50, max: 3000, unit: "mm" },
    "pile.side_mm": { min: 50, max: 3000, unit: "mm" },
    "pile.area_mm2": { min: 500, max: 3e6, unit: "mm²" },
    "pile.length_m": { min: 1, max: 80, unit: "m" },
    "pile.length_max_m": { min: 1, max: 80, unit: "m" },
    "pile.length_step_m": { min: 0.1, max: 80, unit: "m" },
    "pile.density_kg_m3": { min: 200, max: 9000, unit: "kg/m³" },
    "pile.modulus_mpa": { min: 1000, max: 250000, unit: "MPa" },
    "pile.mass_kg": { min: 1, max: 200000, unit: "kg" },
    "pile.mass_fraction": { min: 0.25, max: 1, unit: "" },
    "pile.strength_mpa": { min: 1, max: 1000, unit: "MPa" },
    "pile.limit_factor": { min: 0.1, max: 3, unit: "" },
    "driven_parts_kg": { min: 0, max: 20000, unit: "kg" },
    "compression.cq_mm": { min: 0, max: 10, unit: "mm" },
    "compression.cc_mm": { min: 0, max: 50, unit: "mm" },
    "compression.cp_mm": { min: 0, max: 100, unit: "mm" },
    "design.load_kn": { min: 1, max: 50000, unit: "kN" },
    "design.phi": { min: 0.1, max: 1, unit: "" },
    "design.factor_of_safety": { min: 1, max: 5, unit: "" },
    "zones.easy_below_mpa": { min: 0.1, max: 1000, unit: "MPa" },
    "zones.hard_from_mpa": { min: 0.1, max: 1000, unit: "MPa" },
    "min_set_mm_per_blow": { min: 0, max: 25, unit: "mm" },
  };
  const MAX_DROPS = 12;
  const MAX_FILE_BYTES = 1 << 20;

  // Quantities: SI unit, US customary unit, and the factor from SI to US.
  const QUANT = {
    mass: { si: "kg", us: "lb", f: 1 / 0.45359237 },
    length: { si: "m", us: "ft", f: 1 / 0.3048 },
    small: { si: "mm", us: "in", f: 1 / 25.4 },
    area: { si: "mm²", us: "in²", f: 1 / 645.16 },
    force: { si: "kN", us: "kip", f: 1 / 4.4482216152605 },
    stress: { si: "MPa", us: "ksi", f: 1 / 6.894757293168361 },
    density: { si: "kg/m³", us: "lb/ft³", f: (0.3048 * 0.3048 * 0.3048) / 0.45359237 },
    ratio: { si: "", us: "", f: 1 },
  };

  // A number as the form accepts it: a plain decimal with a point.
  const NUMBER_RE = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

  const KEY_INDEX = "setcard.projects";
  const KEY_PROJECT = "setcard.project.";
  const KEY_UNITS = "setcard.units";
  const KEY_PAPER = "setcard.paper";
  const KEY_CORRUPT = "setcard.corrupt.";

  // ---------------------------------------------------------------------
  // Elements.

  const $ = (id) => document.getElementById(id);
  const el = {
    frame: $("chart-frame"),
    chartBox: $("chart-box"),
    chartSvg: $("chart-svg"),
    chartNotice: $("chart-notice"),
    chartStatus: $("chart-status"),
    appMsg: $("app-msg"),
    form: $("project-form"),
    formMsg: $("form-msg"),
    formStatus: $("form-status"),
    dropsList: $("drops-list"),
    dropsAdd: $("drops-add"),
    tableHead: $("set-table-head"),
    tableBody: $("set-table-body"),
    tableCaption: $("set-table-caption"),
    tableNotes: $("set-table-notes"),
    copyTable: $("copy-table"),
    copyStatus: $("copy-table-status"),
    projectList: $("project-list"),
    projectNew: $("project-new"),
    projectRename: $("project-rename"),
    projectDuplicate: $("project-duplicate"),
    projectDelete: $("project-delete"),
    fileOpen: $("file-open"),
    fileInput: $("file-input"),
    fileSave: $("file-save"),
    shareCopy: $("share-copy"),
    shareFallback: $("share-fallback"),
    shareLink: $("share-link"),
    unitsSI: $("units-si"),
    unitsUS: $("units-us"),
    paper: $("print-paper"),
    print: $("print-button"),
    printArea: $("print-area"),
  };

  // ---------------------------------------------------------------------
  // State.

  let core = null; // setcardCore of the iframe, once ready
  let coreDead = false;
  let limits = FALLBACK_LIMITS;
  let noGL = false;
  let units = "si";
  let current = null; // the last valid project (SI), as the core gave it
  let currentJSON = "";
  let rows = [];
  let formHasErrors = false;

  let ready = false;
  let firstDrawSeen = false;
  let initialApplied = false;
  let framesAtApply = -1;

  // Projects kept in this browser: ids in list order and, per id, the saved
  // item {project, draft}.
  let storageOK = true;
  let order = [];
  const items = new Map();
  let currentId = "";

  // Display cache of each numeric input: the text last written into it and
  // the exact SI value that text stands for. A field whose text is unchanged
  // gives back its SI value untouched, so that showing US units never rounds
  // the stored project.
  const shown = new WeakMap();

  // ---------------------------------------------------------------------
  // Small helpers.

  function clone(v) {
    return JSON.parse(JSON.stringify(v));
  }

  function parseJSON(text) {
    try {
      return JSON.parse(text);
    } catch (e) {
      return undefined;
    }
  }

  function isObject(v) {
    return v !== null && typeof v === "object" && !Array.isArray(v);
  }

  function debounce(fn, ms) {
    let t = 0;
    const wrapped = (...args) => {
      clearTimeout(t);
      t = setTimeout(() => {
        t = 0;
        fn(...args);
      }, ms);
    };
    wrapped.cancel = () => {
      clearTimeout(t);
      t = 0;
    };
    wrapped.flush = () => {
      if (t) {
        clearTimeout(t);
        t = 0;
        fn();
      }
    };
    return wrapped;
  }

  // clean drops the noise of a unit conversion (0.30000000000000004).
  function clean(v) {
    return Number(v.toPrecision(12));
  }

  function fmtNum(v, sig) {
    if (!Number.isFinite(v)) {
      return String(v);
    }
    return String(Number(v.toPrecision(sig)) + 0);
  }

  // roundSig rounds to sig significant digits: up when dir > 0, down when
  // dir < 0, to nearest otherwise.
  function roundSig(v, sig, dir) {
    if (v === 0 || !Number.isFinite(v)) {
      return v;
    }
    const p = Math.pow(10, sig - 1 - Math.floor(Math.log10(Math.abs(v))));
    const x = v * p;
    let r = Math.round(x);
    if (dir > 0) {
      r = Math.ceil(x - 1e-9);
    } else if (dir < 0) {
      r = Math.floor(x + 1e-9);
    }
    return clean(r / p);
  }

  function getPath(obj, path) {
    let v = obj;
    for (const k of path.split(".")) {
      if (!isObject(v)) {
        return undefined;
      }
      v = v[k];
    }
    return v;
  }

  function setPath(obj, path, value) {
    const keys = path.split(".");
    let o = obj;
    for (let i = 0; i < keys.length - 1; i++) {
      if (!isObject(o[keys[i]])) {
        if (value === undefined) {
          return;
        }
        o[keys[i]] = {};
      }
      o = o[keys[i]];
    }
    const last = keys[keys.length - 1];
    if (value === undefined) {
      delete o[last];
    } else {
      o[last] = value;
    }
  }

  function shorten(s, n) {
    const chars = Array.from(s);
    return chars.length > n ? chars.slice(0, n).join("") + "…" : s;
  }

  function projectName(p) {
    const n = p && typeof p.name === "string" ? p.name.trim() : "";
    return n === "" ? "Untitled project" : n;
  }

  // ---------------------------------------------------------------------
  // Messages at the top of the page (files, links, storage, the core).

  function notify(text, kind) {
    const p = document.createElement("p");
    p.className = "app-msg-item" + (kind ? " " + kind : "");
    const span = document.createElement("span");
    span.textContent = text;
    const close = document.createElement("button");
    close.type = "button";
    close.className = "dismiss";
    close.textContent = "Dismiss";
    close.setAttribute("aria-label", "Dismiss this message");
    close.addEventListener("click", () => p.remove());
    p.append(span, close);
    el.appMsg.append(p);
    if (kind === "info") {
      setTimeout(() => p.remove(), 15000);
    }
    while (el.appMsg.children.length > 6) {
      el.appMsg.firstElementChild.remove();
    }
  }

  function clearNotices(kind) {
    for (const p of Array.from(el.appMsg.children)) {
      if (!kind || p.classList.contains(kind)) {
        p.remove();
      }
    }
  }

  // ---------------------------------------------------------------------
  // Core calls. Every result is a string; JSON travels as strings.

  function call(name, ...args) {
    if (!core || coreDead) {
      return undefined;
    }
    try {
      return core[name](...args);
    } catch (e) {
      reportCoreError(name, e);
      return undefined;
    }
  }

  function callJSON(name, ...args) {
    const r = call(name, ...args);
    return typeof r === "string" ? parseJSON(r) : undefined;
  }

  let coreErrorShown = false;
  function reportCoreError(name, e) {
    console.error("setcardCore." + name, e);
    if (!coreErrorShown) {
      coreErrorShown = true;
      notify("The calculation program failed (" + name + ": " + String(e && e.message ? e.message : e) + "). Your project is kept; reload the page.", "error");
    }
  }

  // A result of check or apply, always with an errors list.
  function result(r) {
    if (!isObject(r)) {
      return { ok: false, errors: [{ field: "(core)", problem: "gave no answer", message: "The calculation program gave no answer." }] };
    }
    if (!Array.isArray(r.errors)) {
      r.errors = [];
    }
    return r;
  }

  // ---------------------------------------------------------------------
  // Units.

  function toShown(q, si) {
    return units === "us" ? si * QUANT[q].f : si;
  }

  function fromShown(q, v) {
    return units === "us" && QUANT[q].f !== 1 ? clean(v / QUANT[q].f) : v;
  }

  function fmtShown(q, si) {
    return units === "us" ? fmtNum(toShown(q, si), 6) : fmtNum(si, 12);
  }

  function unitLabel(q) {
    return units === "us" ? QUANT[q].us : QUANT[q].si;
  }

  function limitFor(path) {
    const key = path.replace(/\[\d+\]$/, "");
    const l = limits[key] || FALLBACK_LIMITS[key];
    return l && Number.isFinite(l.min) && Number.isFinite(l.max) ? l : null;
  }

  // The allowed range of a field in the units shown, rounded inwards so that
  // every value inside the shown range is accepted.
  function shownRange(path, q) {
    const l = limitFor(path);
    if (!l) {
      return null;
    }
    if (units === "si" || !q || QUANT[q].f === 1) {
      return { min: l.min, max: l.max, unit: l.unit || (q ? QUANT[q].si : "") };
    }
    return {
      min: roundSig(l.min * QUANT[q].f, 5, 1),
      max: roundSig(l.max * QUANT[q].f, 5, -1),
      unit: QUANT[q].us,
    };
  }

  function rangeText(path, q) {
    const r = shownRange(path, q);
    if (!r) {
      return "";
    }
    return fmtNum(r.min, 12) + " to " + fmtNum(r.max, 12) + (r.unit ? " " + r.unit : "");
  }

  // ---------------------------------------------------------------------
  // The form: fields are the elements with data-path. data-kind says what
  // they are: num, text, select, section, convention, caps, drops.

  function fields() {
    return Array.from(el.form.querySelectorAll("[data-path]"));
  }

  function isActive(f) {
    return !f.closest("[hidden]");
  }

  function labelOf(f) {
    if (f.dataset.label) {
      return f.dataset.label;
    }
    const l = f.id ? el.form.querySelector("label[for=\"" + f.id + "\"]") : null;
    return l ? l.textContent.trim() : f.dataset.path;
  }

  function msgOf(f) {
    return $(f.id + "-msg");
  }

  function dropInputs() {
    return Array.from(el.dropsList.querySelectorAll("input[data-path]"));
  }

  // renderDrops rebuilds the list of drop inputs with n entries.
  function renderDrops(n) {
    const focused = document.activeElement;
    const focusId = focused && el.dropsList.contains(focused) ? focused.id : "";
    el.dropsList.replaceChildren();
    for (let i = 0; i < n; i++) {
      const id = "f-drops_m-" + i;
      const row = document.createElement("div");
      row.className = "field drop";
      const label = document.createElement("label");
      label.htmlFor = id;
      label.textContent = "Drop " + (i + 1);
      const input = document.createElement("input");
      input.type = "text";
      input.inputMode = "decimal";
      input.id = id;
      input.autocomplete = "off";
      input.dataset.path = "drops_m[" + i + "]";
      input.dataset.kind = "num";
      input.dataset.q = "length";
      input.dataset.label = "Drop " + (i + 1);
      input.setAttribute("aria-describedby", id + "-unit " + id + "-msg");
      const msg = document.createElement("p");
      msg.className = "msg";
      msg.id = id + "-msg";
      msg.setAttribute("aria-live", "polite");
      const unit = document.createElement("span");
      unit.className = "unit";
      unit.id = id + "-unit";
      unit.textContent = unitLabel("length");
      const remove = document.createElement("button");
      remove.type = "button";
      remove.className = "drop-remove";
      remove.id = "drops-remove-" + i;
      remove.textContent = "Remove";
      remove.setAttribute("aria-label", "Remove drop " + (i + 1));
      remove.disabled = n <= 1;
      remove.addEventListener("click", () => removeDrop(i));
      row.append(label, input, msg, unit, remove);
      el.dropsList.append(row);
      setLimitAttrs(input);
    }
    el.dropsAdd.disabled = n >= MAX_DROPS;
    if (focusId && $(focusId)) {
      $(focusId).focus();
    }
  }

  function setLimitAttrs(f) {
    const r = shownRange(f.dataset.path, f.dataset.q);
    if (r) {
      f.setAttribute("min", fmtNum(r.min, 12));
      f.setAttribute("max", fmtNum(r.max, 12));
    }
  }

  function setNum(f, si) {
    const q = f.dataset.q;
    const ok = typeof si === "number" && Number.isFinite(si);
    const text = ok ? fmtShown(q, si) : "";
    f.value = text;
    shown.set(f, { text, si: ok ? si : undefined });
  }

  function projectValue(p, f) {
    const path = f.dataset.path;
    const m = /^drops_m\[(\d+)\]$/.exec(path);
    if (m) {
      return Array.isArray(p.drops_m) ? p.drops_m[Number(m[1])] : undefined;
    }
    return getPath(p, path);
  }

  // renderField writes one field from the project.
  function renderField(f, p) {
    const kind = f.dataset.kind;
    const path = f.dataset.path;
    switch (kind) {
      case "num":
        setNum(f, projectValue(p, f));
        break;
      case "text": {
        const v = getPath(p, path);
        f.value = typeof v === "string" ? v : "";
        break;
      }
      case "select": {
        let v = getPath(p, path);
        if (path === "hammer.type" && !v) {
          v = "drop-winch";
        } else if (path === "compression.method" && !v) {
          v = "interpolated";
        } else if (path === "design.chart_basis" && v === "design") {
          v = "";
        }
        f.value = typeof v === "string" ? v : "";
        if (f.value !== (typeof v === "string" ? v : "")) {
          f.selectedIndex = 0;
        }
        break;
      }
      case "section": {
        const pile = isObject(p.pile) ? p.pile : {};
        f.value = pile.side_mm !== undefined ? "side_mm" : pile.area_mm2 !== undefined ? "area_mm2" : "diameter_mm";
        break;
      }
      case "convention":
        f.value = isObject(p.design) && p.design.factor_of_safety !== undefined && p.design.phi === undefined ? "factor_of_safety" : "phi";
        break;
      case "caps": {
        const cap = isObject(p.compression) && Array.isArray(p.compression.cap) ? p.compression.cap : [];
        for (const box of f.querySelectorAll("input[type=checkbox]")) {
          box.checked = cap.includes(box.value);
        }
        break;
      }
      default:
        break;
    }
  }

  // updateVisibility shows the inputs that the choices call for.
  function updateVisibility() {
    const section = $("f-pile-section").value;
    $("f-pile-section").dataset.shown = section;
    for (const d of el.form.querySelectorAll("[data-section]")) {
      d.hidden = d.dataset.section !== section;
    }
    const convention = $("f-design-convention").value;
    for (const d of el.form.querySelectorAll("[data-convention]")) {
      d.hidden = d.dataset.convention !== convention;
    }
    const given = $("f-compression-method").value === "given";
    $("f-compression-cap").hidden = given;
    for (const d of el.form.querySelectorAll("[data-given]")) {
      d.hidden = !given;
    }
  }

  // renderForm writes every field from the project, then lays the user's
  // unapplied text (draft) over it.
  function renderForm(p, draft) {
    const nDrops = Array.isArray(p.drops_m) ? p.drops_m.length : 1;
    const dn = draft && Number.isInteger(draft.drops) ? draft.drops : 0;
    renderDrops(Math.min(MAX_DROPS, Math.max(1, nDrops, dn)));
    for (const f of fields()) {
      renderField(f, p);
    }
    updateVisibility();
    if (draft) {
      applyDraft(draft);
      updateVisibility();
    }
    clearMessages();
  }

  function captureDraft() {
    const values = {};
    const checks = {};
    for (const f of el.form.querySelectorAll("input, select, textarea")) {
      if (!f.id || f.type === "file") {
        continue;
      }
      if (f.type === "checkbox") {
        checks[f.id] = f.checked;
      } else {
        values[f.id] = f.value;
      }
    }
    return { units, drops: dropInputs().length, values, checks };
  }

  function applyDraft(draft) {
    const values = isObject(draft.values) ? draft.values : {};
    const checks = isObject(draft.checks) ? draft.checks : {};
    for (const [id, v] of Object.entries(values)) {
      const f = $(id);
      if (!f || !el.form.contains(f) || typeof v !== "string") {
        continue;
      }
      let text = v;
      if (f.dataset.kind === "num" && draft.units !== units && (draft.units === "si" || draft.units === "us")) {
        text = convertText(text, f.dataset.q, draft.units, units);
      }
      if (f.tagName === "SELECT" && !Array.from(f.options).some((o) => o.value === text)) {
        continue;
      }
      f.value = text;
    }
    for (const [id, v] of Object.entries(checks)) {
      const f = $(id);
      if (f && el.form.contains(f) && f.type === "checkbox") {
        f.checked = Boolean(v);
      }
    }
  }

  // convertText converts typed text between unit systems when it is a
  // number, and leaves anything else as the user typed it.
  function convertText(text, q, from, to) {
    const t = text.trim();
    if (!q || from === to || !NUMBER_RE.test(t)) {
      return text;
    }
    const v = Number(t);
    if (!Number.isFinite(v)) {
      return text;
    }
    const si = from === "us" ? v / QUANT[q].f : v;
    return to === "us" ? fmtNum(si * QUANT[q].f, 6) : fmtNum(clean(si), 12);
  }

  // readNum reads a numeric field: {ok, value} with value in SI (undefined
  // for an empty optional field), or {ok: false, message}.
  function readNum(f) {
    const raw = f.value;
    const c = shown.get(f);
    const optional = f.dataset.optional === "true";
    if (c && raw === c.text && (c.si !== undefined || optional)) {
      return { ok: true, value: c.si };
    }
    const t = raw.trim();
    const range = rangeText(f.dataset.path, f.dataset.q);
    const allowed = range ? "; allowed " + range + "." : ".";
    const label = labelOf(f);
    if (t === "") {
      if (optional) {
        return { ok: true, value: undefined };
      }
      return { ok: false, message: label + ": a number is required" + allowed };
    }
    const quoted = "\"" + shorten(t, 40) + "\"";
    if (!NUMBER_RE.test(t)) {
      if (/^[+-]?[\d.]*,[\d.,]*$/.test(t) && /\d/.test(t)) {
        return { ok: false, message: label + ": " + quoted + " is not a number. Use a point for decimals" + allowed };
      }
      return { ok: false, message: label + ": " + quoted + " is not a number" + allowed };
    }
    const v = Number(t);
    if (!Number.isFinite(v)) {
      return { ok: false, message: label + ": " + quoted + " is not a finite number" + allowed };
    }
    return { ok: true, value: fromShown(f.dataset.q, v) };
  }

  // buildProject reads the form over the last valid project: the result and
  // the fields that cannot be read (left at their last valid value).
  function buildProject() {
    const p = clone(current || DEMO);
    const bad = [];
    p.format = FORMAT;
    for (const f of fields()) {
      const kind = f.dataset.kind;
      const path = f.dataset.path;
      if (kind === "drops" || kind === "caps" || kind === "section" || kind === "convention" || path.startsWith("drops_m[")) {
        continue;
      }
      if (!isActive(f)) {
        if (kind === "num") {
          setPath(p, path, undefined); // the other section, convention or method
        }
        continue;
      }
      if (kind === "num") {
        const r = readNum(f);
        if (!r.ok) {
          bad.push({ f, message: r.message });
          continue;
        }
        setPath(p, path, r.value);
      } else if (kind === "text") {
        setPath(p, path, f.value === "" ? undefined : f.value);
      } else if (kind === "select") {
        setPath(p, path, f.value === "" ? undefined : f.value);
      }
    }
    const drops = [];
    const last = current && Array.isArray(current.drops_m) ? current.drops_m : [];
    dropInputs().forEach((f, i) => {
      const r = readNum(f);
      if (!r.ok) {
        bad.push({ f, message: r.message });
        if (last[i] !== undefined) {
          drops.push(last[i]);
        }
      } else if (r.value === undefined) {
        bad.push({ f, message: labelOf(f) + ": a number is required; allowed " + rangeText(f.dataset.path, "length") + "." });
      } else {
        drops.push(r.value);
      }
    });
    p.drops_m = drops;
    if (!isObject(p.compression)) {
      p.compression = {};
    }
    if (p.compression.method === "given") {
      p.compression.cap = [];
    } else {
      p.compression.cap = Array.from($("f-compression-cap").querySelectorAll("input[type=checkbox]"))
        .filter((b) => b.checked).map((b) => b.value);
    }
    for (const k of ["zones", "card"]) {
      if (isObject(p[k]) && Object.keys(p[k]).length === 0) {
        delete p[k];
      }
    }
    return { project: p, bad };
  }

  // ---------------------------------------------------------------------
  // Messages beside the fields.

  function clearMessages() {
    for (const m of el.form.querySelectorAll(".msg")) {
      m.textContent = "";
    }
    for (const f of el.form.querySelectorAll("[aria-invalid]")) {
      f.removeAttribute("aria-invalid");
    }
    for (const f of el.form.querySelectorAll(".invalid")) {
      f.classList.remove("invalid");
    }
    el.formStatus.textContent = "";
  }

  function addMessage(f, text) {
    const m = f ? msgOf(f) : null;
    const target = m || el.formMsg;
    target.textContent = target.textContent ? target.textContent + "\n" + text : text;
    if (f) {
      if (f.tagName === "FIELDSET") {
        f.classList.add("invalid");
      } else {
        f.setAttribute("aria-invalid", "true");
      }
    }
  }

  const SECTION_KEYS = ["pile.diameter_mm", "pile.side_mm", "pile.area_mm2"];
  const CONVENTION_KEYS = ["design.phi", "design.factor_of_safety"];

  // targetOf finds the visible field for a core error's field path.
  function targetOf(field) {
    const all = fields();
    const find = (path) => all.find((f) => f.dataset.path === path && isActive(f));
    let f = find(field) || find(field.replace(/\[\d+\]$/, ""));
    if (!f && SECTION_KEYS.includes(field)) {
      f = find(SECTION_KEYS.find((k) => find(k)) || "") || $("f-pile-section");
    }
    if (!f && CONVENTION_KEYS.includes(field)) {
      f = $("f-design-convention");
    }
    if (!f && /^compression\.c[cp]_mm$/.test(field)) {
      f = $("f-compression-method");
    }
    return f || null;
  }

  function pathLabel(field) {
    const f = fields().find((x) => x.dataset.path === field);
    return f ? labelOf(f) : field;
  }

  // withLabels names the fields in a core phrase by their labels:
  // "more than pile.length_m (6 m)" becomes "more than Pile length (6 m)".
  function withLabels(text) {
    return text.replace(/[a-z_]+(\.[a-z_0-9]+)+|drops_m|driven_parts_kg|min_set_mm_per_blow/g, (path) => {
      const f = fields().find((x) => x.dataset.path === path);
      return f ? labelOf(f) : path;
    });
  }

  const RANGE_PROBLEMS = ["is out of range", "is not a finite number", "is required"];

  function coreMessage(err, f) {
    const field = String(err.field || "");
    if (!err.problem) {
      return String(err.message || field + ": not accepted");
    }
    const label = f ? labelOf(f) : pathLabel(field);
    let value = err.value ? String(err.value) : "";
    if (f && f.dataset.kind === "num" && f.dataset.path === field) {
      const t = f.value.trim();
      if (t !== "") {
        value = "\"" + shorten(t, 40) + "\"";
      } else if (value !== "" && Number.isFinite(Number(value))) {
        // An empty optional field: the core used the default.
        value = fmtShown(f.dataset.q, Number(value)) + (unitLabel(f.dataset.q) ? " " + unitLabel(f.dataset.q) : "") + " (the default)";
      }
    }
    let allowed = err.allowed ? String(err.allowed) : "";
    if (f && f.dataset.kind === "num" && RANGE_PROBLEMS.includes(err.problem)) {
      allowed = rangeText(f.dataset.path, f.dataset.q) || allowed;
    } else {
      allowed = withLabels(allowed);
    }
    const problem = err.problem === "is required" && !value && f && f.dataset.kind === "num" ? "a number is required" : err.problem;
    return label + ": " + (value ? value + " " : "") + problem + (allowed ? "; allowed " + allowed : "") + ".";
  }

  function showCoreErrors(errors, skip) {
    for (const err of errors) {
      const f = targetOf(String(err.field || ""));
      if (f && skip && skip.has(f)) {
        continue;
      }
      addMessage(f, coreMessage(err, f));
    }
  }

  // A core error as one plain line, for files and links.
  function plainError(err) {
    if (!err.problem) {
      return String(err.message || err.field);
    }
    const field = err.field === "(file)" ? "the file" : String(err.field);
    return field + (err.value ? " = " + err.value : "") + " " + err.problem + (err.allowed ? "; allowed: " + err.allowed : "");
  }

  // ---------------------------------------------------------------------
  // Validate and apply.

  const scheduleValidate = debounce(() => validateAndApply(), 150);

  function validateAndApply() {
    scheduleValidate.cancel();
    const { project, bad } = buildProject();
    clearMessages();
    if (bad.length > 0 || !core) {
      for (const b of bad) {
        addMessage(b.f, b.message);
      }
      if (core) {
        const r = result(callJSON("check", JSON.stringify(project)));
        showCoreErrors(r.errors, new Set(bad.map((b) => b.f)));
      }
      setFormErrors(bad.length > 0);
      return false;
    }
    const json = JSON.stringify(project);
    if (json === currentJSON) {
      setFormErrors(false);
      return true;
    }
    const r = result(callJSON("apply", json));
    if (!r.ok) {
      showCoreErrors(r.errors.length ? r.errors : [{ field: "(core)", message: "The project was not accepted." }]);
      setFormErrors(true);
      return false;
    }
    setFormErrors(false);
    acceptApplied(r.rows);
    return true;
  }

  function setFormErrors(has) {
    formHasErrors = has;
    el.formStatus.textContent = has ? "Not applied: fix the marked fields. The chart and table show the last valid project." : "";
    el.form.classList.toggle("has-errors", has);
    saveCurrent(true);
  }

  // acceptApplied takes the project the core now holds as current, without
  // touching what the user typed.
  function acceptApplied(newRows) {
    const p = parseJSON(call("project"));
    if (!isObject(p)) {
      return;
    }
    current = p;
    currentJSON = JSON.stringify(buildComparable(p));
    for (const f of fields()) {
      if (f.dataset.kind === "num" && isActive(f)) {
        const v = projectValue(p, f);
        const r = readNum(f);
        if (r.ok && r.value === (typeof v === "number" ? v : undefined)) {
          shown.set(f, { text: f.value, si: r.value });
        }
      }
    }
    rows = Array.isArray(newRows) ? newRows : readRows();
    afterProjectChange();
  }

  // buildComparable is the project as buildProject would give it from a form
  // that shows it, so that an unchanged form is not applied again.
  function buildComparable(p) {
    const q = clone(p);
    q.format = FORMAT;
    return q;
  }

  function readRows() {
    const r = callJSON("rows");
    return r && Array.isArray(r.rows) ? r.rows : [];
  }

  function afterProjectChange() {
    renderTable();
    updateProjectName();
    saveCurrent(false);
    scheduleCard();
    if (noGL) {
      scheduleSVG();
    }
  }

  // applyProject hands a whole project to the core (opening, switching,
  // importing). On success it becomes current and the form shows it.
  function applyProject(p, draft) {
    const r = result(callJSON("apply", JSON.stringify(p)));
    if (!r.ok) {
      return r;
    }
    const now = parseJSON(call("project"));
    current = isObject(now) ? now : p;
    currentJSON = JSON.stringify(buildComparable(current));
    rows = Array.isArray(r.rows) ? r.rows : readRows();
    renderForm(current, draft);
    if (draft) {
      validateAndApply();
    } else {
      setFormErrors(false);
    }
    afterProjectChange();
    return r;
  }

  // ---------------------------------------------------------------------
  // Drops.

  function addDrop() {
    const inputs = dropInputs();
    if (inputs.length >= MAX_DROPS) {
      return;
    }
    const values = inputs.map((f) => readNum(f)).filter((r) => r.ok && typeof r.value === "number").map((r) => r.value);
    let next = values.length ? Math.round((Math.max(...values) + 0.3) * 100) / 100 : 1;
    const lim = limitFor("drops_m") || { min: 0.05, max: 5 };
    if (next > lim.max) {
      next = lim.max;
      while (values.includes(next) && next > lim.min) {
        next = Math.round((next - 0.05) * 100) / 100;
      }
    }
    const draft = captureDraft();
    renderDrops(inputs.length + 1);
    keepDropTexts(draft, -1);
    const f = $("f-drops_m-" + inputs.length);
    f.value = fmtShown("length", next); // read back as typed text
    f.focus();
    validateAndApply();
  }

  function removeDrop(i) {
    const inputs = dropInputs();
    if (inputs.length <= 1) {
      return;
    }
    const draft = captureDraft();
    renderDrops(inputs.length - 1);
    keepDropTexts(draft, i);
    const next = $("drops-remove-" + Math.min(i, inputs.length - 2)) || el.dropsAdd;
    if (next.disabled) {
      el.dropsAdd.focus();
    } else {
      next.focus();
    }
    validateAndApply();
  }

  // keepDropTexts puts the drop texts of a captured form back, skipping the
  // removed index.
  function keepDropTexts(draft, removed) {
    const kept = [];
    for (let i = 0; i < draft.drops; i++) {
      if (i !== removed) {
        kept.push({ text: draft.values["f-drops_m-" + i], i });
      }
    }
    const last = current && Array.isArray(current.drops_m) ? current.drops_m : [];
    kept.forEach((o, j) => {
      const f = $("f-drops_m-" + j);
      if (!f || typeof o.text !== "string") {
        return;
      }
      f.value = o.text;
      const si = last[o.i];
      if (typeof si === "number" && fmtShown("length", si) === o.text) {
        shown.set(f, { text: o.text, si });
      } else {
        shown.delete(f);
      }
    });
  }

  // ---------------------------------------------------------------------
  // Choices that swap inputs.

  // onSectionChange fills the newly shown size, when empty, with the size
  // of the same area.
  function onSectionChange() {
    const select = $("f-pile-section");
    const prevKey = select.dataset.shown || "diameter_mm";
    const key = select.value;
    const from = $("f-pile-" + prevKey);
    const to = $("f-pile-" + key);
    const r = from && prevKey !== key ? readNum(from) : { ok: false };
    updateVisibility();
    if (r.ok && typeof r.value === "number" && to && to.value.trim() === "") {
      const v = r.value;
      const d = prevKey === "diameter_mm" ? v : prevKey === "side_mm" ? 2 * v / Math.sqrt(Math.PI) : Math.sqrt(4 * v / Math.PI);
      let w;
      if (key === "diameter_mm") {
        w = Math.round(d * 10) / 10;
      } else if (key === "side_mm") {
        w = Math.round(d * Math.sqrt(Math.PI) / 2 * 10) / 10;
      } else {
        w = Math.round(Math.PI * d * d / 4);
      }
      setNum(to, w);
    }
    validateAndApply();
  }

  function onConventionChange() {
    const key = $("f-design-convention").value;
    const from = $(key === "phi" ? "f-design-factor_of_safety" : "f-design-phi");
    const to = $("f-design-" + key);
    const r = readNum(from);
    updateVisibility();
    if (r.ok && typeof r.value === "number" && r.value > 0 && to.value.trim() === "") {
      const v = Math.round(100 / r.value) / 100;
      setNum(to, v);
    }
    validateAndApply();
  }

  // ---------------------------------------------------------------------
  // The required-set table.

  function tableColumns() {
    const len = unitLabel("length");
    const small = unitLabel("small");
    const stress = unitLabel("stress");
    const force = unitLabel("force");
    return [
      "Drop (" + len + ")",
      "Pile length (" + len + ")",
      "Stop at, per 10 blows (" + small + ")",
      "Set per blow (" + small + ")",
      "Driving",
      "Head stress (" + stress + ")",
      "Impact stress / limit (" + stress + ")",
      "Capacity at refusal (" + force + ")",
      "Notes",
    ];
  }

  function fmtLen(m) {
    return units === "us" ? fmtNum(m / 0.3048, 4) : fmtNum(m, 6);
  }

  function fmtSet(mm) {
    return units === "us" ? (mm / 25.4).toFixed(3) : mm.toFixed(2);
  }

  function fmtStress(mpa) {
    return units === "us" ? (mpa / 6.894757293168361).toFixed(2) : mpa.toFixed(1);
  }

  function fmtForce(kn) {
    const v = units === "us" ? kn / 4.4482216152605 : kn;
    return Math.abs(v) >= 100 ? v.toFixed(0) : v.toFixed(1);
  }

  function cell(tag, text, key, si) {
    const c = document.createElement(tag);
    c.textContent = text;
    if (key) {
      c.dataset.key = key;
    }
    if (si !== undefined && si !== null) {
      c.dataset.si = String(si);
    }
    return c;
  }

  function renderTable() {
    const head = tableColumns().map((t) => {
      const th = document.createElement("th");
      th.scope = "col";
      th.textContent = t;
      return th;
    });
    el.tableHead.replaceChildren(...head);
    // Long explanations go to numbered notes under the table, each once.
    const notes = new Map();
    const ref = (text) => {
      if (!notes.has(text)) {
        notes.set(text, notes.size + 1);
      }
      return "[" + notes.get(text) + "]";
    };
    const body = [];
    for (const r of rows) {
      const tr = document.createElement("tr");
      const hasSet = typeof r.set_mm_per_blow === "number";
      const th = cell("th", fmtLen(r.drop_m), "drop_m", r.drop_m);
      th.scope = "row";
      const tags = [];
      if (r.governs) {
        tags.push("governs");
      }
      if (!r.achievable) {
        tags.push("cannot prove" + (r.reason ? " " + ref(String(r.reason)) : ""));
      }
      if (r.overstressed) {
        tags.push("over limit");
      }
      const refs = [];
      for (const w of Array.isArray(r.warnings) ? r.warnings : []) {
        if (w && w !== r.reason) {
          refs.push(ref(String(w)));
        }
      }
      if (refs.length > 0) {
        tags.push("see " + refs.join(" "));
      }
      tr.append(
        th,
        cell("td", fmtLen(r.length_m), "length_m", r.length_m),
        cell("td", hasSet ? fmtSet(r.set_mm_per_10_blows) : "none", "set_mm_per_10_blows", r.set_mm_per_10_blows),
        cell("td", hasSet ? fmtSet(r.set_mm_per_blow) : "none", "set_mm_per_blow", r.set_mm_per_blow),
        cell("td", String(r.zone || ""), "zone", r.zone),
        cell("td", fmtStress(Number(r.head_stress_mpa)), "head_stress_mpa", r.head_stress_mpa),
        cell("td", fmtStress(Number(r.impact_stress_mpa)) + " / " + fmtStress(Number(r.limit_mpa)), "impact_stress_mpa", r.impact_stress_mpa),
        cell("td", fmtForce(Number(r.refusal_kn)), "refusal_kn", r.refusal_kn),
        cell("td", tags.join("; "), "notes"),
      );
      tr.classList.toggle("governs", Boolean(r.governs));
      tr.classList.toggle("over", Boolean(r.overstressed));
      tr.classList.toggle("not-achievable", !r.achievable);
      body.push(tr);
    }
    el.tableBody.replaceChildren(...body);
    const items = [];
    for (const [text, n] of notes) {
      const li = document.createElement("li");
      li.value = n;
      li.textContent = text;
      items.push(li);
    }
    el.tableNotes.replaceChildren(...items);
    el.tableNotes.hidden = items.length === 0;
    if (rows.length > 0) {
      const r0 = rows[0];
      const fu = unitLabel("force");
      const load = fmtForce(Number(r0.design_kn));
      const ult = fmtForce(Number(r0.ultimate_kn));
      el.tableCaption.textContent = "Required set for a design load of " + load + " " + fu + " (ultimate " + ult + " " + fu + "), by drop and pile length";
    } else {
      el.tableCaption.textContent = "Required set by drop and pile length";
    }
    el.copyTable.disabled = rows.length === 0;
  }

  function tableTSV() {
    const clean1 = (s) => s.replace(/[\t\r\n]+/g, " ").trim();
    const lines = [];
    lines.push(clean1(el.tableCaption.textContent));
    lines.push(Array.from(el.tableHead.children).map((c) => clean1(c.textContent)).join("\t"));
    for (const tr of el.tableBody.children) {
      lines.push(Array.from(tr.children).map((c) => clean1(c.textContent)).join("\t"));
    }
    for (const li of el.tableNotes.children) {
      lines.push("[" + li.value + "]\t" + clean1(li.textContent));
    }
    return lines.join("\n") + "\n";
  }

  function copyTable() {
    const text = tableTSV();
    const done = (msg) => {
      el.copyStatus.textContent = msg;
    };
    try {
      if (!navigator.clipboard || !navigator.clipboard.writeText) {
        throw new Error("no clipboard");
      }
      navigator.clipboard.writeText(text).then(
        () => done("Copied " + rows.length + " rows as tab-separated text."),
        () => done("The browser did not allow copying; select the table and copy it instead."),
      );
    } catch (e) {
      done("The browser did not allow copying; select the table and copy it instead.");
    }
  }

  // ---------------------------------------------------------------------
  // Storage: an index {current, ids} and one item {project, draft} per
  // project. Nothing that cannot be read is deleted: it is moved aside.

  function storageGet(key) {
    try {
      return localStorage.getItem(key);
    } catch (e) {
      storageFailed(e);
      return null;
    }
  }

  function storageSet(key, value) {
    try {
      localStorage.setItem(key, value);
      return true;
    } catch (e) {
      storageFailed(e);
      return false;
    }
  }

  let storageWarned = false;
  function storageFailed(e) {
    storageOK = false;
    if (!storageWarned) {
      storageWarned = true;
      notify("This browser did not let Setcard keep your project (" + String(e && e.name ? e.name : e) + "). Save it to a file to keep it.", "error");
    }
  }

  function storageKeys() {
    const keys = [];
    try {
      for (let i = 0; i < localStorage.length; i++) {
        keys.push(localStorage.key(i));
      }
    } catch (e) {
      storageFailed(e);
    }
    return keys;
  }

  // setAside moves unreadable data to setcard.corrupt.<time> and says so.
  function setAside(key, raw, why) {
    let name = KEY_CORRUPT + new Date().toISOString().replace(/[:.]/g, "-");
    for (let n = 2; storageGet(name) !== null; n++) {
      name = KEY_CORRUPT + new Date().toISOString().replace(/[:.]/g, "-") + "-" + n;
    }
    if (storageSet(name, raw)) {
      try {
        localStorage.removeItem(key);
      } catch (e) {
        storageFailed(e);
      }
      notify("Stored data \u201c" + key + "\u201d could not be used (" + why + "). It was set aside as \u201c" + name + "\u201d, not deleted.", "error");
    } else {
      notify("Stored data \u201c" + key + "\u201d could not be used (" + why + ") and could not be set aside; it was left in place.", "error");
    }
  }

  function newId() {
    return "p" + Date.now().toString(36) + Math.random().toString(36).slice(2, 7);
  }

  function loadStorage() {
    const rawIndex = storageGet(KEY_INDEX);
    let ids = [];
    let cur = "";
    if (rawIndex !== null) {
      const idx = parseJSON(rawIndex);
      if (isObject(idx) && Array.isArray(idx.ids) && idx.ids.every((x) => typeof x === "string")) {
        ids = idx.ids.slice();
        cur = typeof idx.current === "string" ? idx.current : "";
      } else {
        setAside(KEY_INDEX, rawIndex, idx === undefined ? "not valid JSON" : "not a list of projects");
      }
    }
    for (const key of storageKeys()) {
      if (key && key.startsWith(KEY_PROJECT)) {
        const id = key.slice(KEY_PROJECT.length);
        if (id && !ids.includes(id)) {
          ids.push(id);
        }
      }
    }
    for (const id of ids) {
      const key = KEY_PROJECT + id;
      const raw = storageGet(key);
      if (raw === null) {
        continue;
      }
      const item = parseJSON(raw);
      if (!isObject(item) || !isObject(item.project)) {
        setAside(key, raw, item === undefined ? "not valid JSON" : "no project in it");
        continue;
      }
      items.set(id, { project: item.project, draft: isObject(item.draft) ? item.draft : null });
      order.push(id);
    }
    currentId = order.includes(cur) ? cur : order[0] || "";
    if (!currentId) {
      currentId = addProject(clone(DEMO), null);
    }
    saveIndex();
  }

  function saveIndex() {
    storageSet(KEY_INDEX, JSON.stringify({ version: 1, current: currentId, ids: order }));
  }

  function writeItem(id) {
    const it = items.get(id);
    if (!it) {
      return;
    }
    storageSet(KEY_PROJECT + id, JSON.stringify({ project: it.project, draft: it.draft, saved: new Date().toISOString() }));
  }

  function addProject(project, draft) {
    const id = newId();
    items.set(id, { project, draft });
    order.push(id);
    writeItem(id);
    saveIndex();
    return id;
  }

  // saveCurrent records the current project and, while the form has errors,
  // what the user typed.
  const writeLater = debounce(() => writeItem(currentId), 200);

  function saveCurrent(soon) {
    if (!currentId || !current) {
      return;
    }
    items.set(currentId, { project: current, draft: formHasErrors ? captureDraft() : null });
    if (soon) {
      writeLater();
    } else {
      writeLater.cancel();
      writeItem(currentId);
    }
  }

  // Before the core answers, typing is kept as a draft of the stored project.
  function saveDraftOnly() {
    const it = items.get(currentId);
    if (it) {
      it.draft = captureDraft();
      writeLater();
    }
  }

  // ---------------------------------------------------------------------
  // Projects.

  function renderProjectList() {
    const opts = order.map((id) => {
      const o = document.createElement("option");
      o.value = id;
      const it = items.get(id);
      o.textContent = shorten(projectName(it ? it.project : null), 80);
      return o;
    });
    el.projectList.replaceChildren(...opts);
    el.projectList.value = currentId;
    el.projectDelete.disabled = order.length === 0;
  }

  function updateProjectName() {
    const o = Array.from(el.projectList.options).find((x) => x.value === currentId);
    if (o && current) {
      o.textContent = shorten(projectName(current), 80);
    }
    document.title = projectName(current) + " \u2013 Setcard";
  }

  // openProject makes a stored project current. A project the core refuses
  // is moved aside and the current one stays.
  function openProject(id) {
    const it = items.get(id);
    if (!it) {
      return false;
    }
    if (!core) {
      currentId = id;
      current = it.project;
      renderForm(it.project, it.draft);
      saveIndex();
      renderProjectList();
      return true;
    }
    const r = result(callJSON("check", JSON.stringify(it.project)));
    if (r.ok) {
      const before = currentId;
      currentId = id;
      const a = applyProject(it.project, it.draft);
      if (!a.ok) {
        currentId = before;
        r.ok = false;
        r.errors = a.errors;
      }
    }
    if (!r.ok) {
      const why = r.errors.map(plainError).join("; ");
      const raw = storageGet(KEY_PROJECT + id) || JSON.stringify(it);
      setAside(KEY_PROJECT + id, raw, why);
      items.delete(id);
      order = order.filter((x) => x !== id);
      saveIndex();
      renderProjectList();
      return false;
    }
    saveIndex();
    renderProjectList();
    return true;
  }

  // openFirstValid opens the current stored project, or the next one that
  // the core accepts, or a new demo project.
  function openFirstValid() {
    const tried = new Set();
    let id = currentId;
    while (id && !tried.has(id)) {
      tried.add(id);
      if (openProject(id)) {
        return;
      }
      id = order.find((x) => !tried.has(x)) || "";
    }
    currentId = addProject(clone(DEMO), null);
    openProject(currentId);
  }

  function newProject() {
    const p = clone(DEMO);
    let n = 1;
    const names = new Set(order.map((id) => projectName(items.get(id).project)));
    while (names.has("New project " + n)) {
      n++;
    }
    p.name = "New project " + n;
    delete p.card;
    const id = addProject(p, null);
    if (openProject(id)) {
      notify("New project started from the demo values: change every input to suit the job.", "info");
    }
  }

  function duplicateProject() {
    if (!current) {
      return;
    }
    const p = clone(current);
    p.name = Array.from(projectName(current) + " (copy)").slice(0, 200).join("");
    const id = addProject(p, null);
    openProject(id);
  }

  function renameProject() {
    if (!current || !core) {
      return;
    }
    const name = window.prompt("New name for this project:", typeof current.name === "string" ? current.name : "");
    if (name === null) {
      return;
    }
    const p = clone(current);
    p.name = name;
    const r = result(callJSON("apply", JSON.stringify(p)));
    if (!r.ok) {
      notify("The name was not changed: " + r.errors.map(plainError).join("; ") + ".", "error");
      return;
    }
    $("f-name").value = name;
    const m = $("f-name-msg");
    m.textContent = "";
    $("f-name").removeAttribute("aria-invalid");
    acceptApplied(r.rows);
  }

  function deleteProject() {
    if (!currentId) {
      return;
    }
    const name = projectName(current);
    if (!window.confirm("Delete the project \u201c" + name + "\u201d from this browser? This cannot be undone; save it to a file first if you may need it.")) {
      return;
    }
    try {
      localStorage.removeItem(KEY_PROJECT + currentId);
    } catch (e) {
      storageFailed(e);
    }
    items.delete(currentId);
    const i = order.indexOf(currentId);
    order = order.filter((x) => x !== currentId);
    currentId = "";
    if (order.length === 0) {
      currentId = addProject(clone(DEMO), null);
      notify("The last project was deleted; the demo project is open.", "info");
    } else {
      currentId = order[Math.min(i, order.length - 1)];
    }
    saveIndex();
    openFirstValid();
    renderProjectList();
  }

  // ---------------------------------------------------------------------
  // Files and share links.

  function fileName(p) {
    const base = projectName(p).normalize("NFKD").replace(/[^A-Za-z0-9._-]+/g, "-").replace(/^[-.]+|[-.]+$/g, "").slice(0, 60);
    return (base || "setcard-project") + ".json";
  }

  function saveFile() {
    if (!current) {
      return;
    }
    const blob = new Blob([JSON.stringify(current, null, 2) + "\n"], { type: "application/json" });
    const url = URL.createObjectURL(blob);
    const a = document.createElement("a");
    a.href = url;
    a.download = fileName(current);
    a.hidden = true;
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 10000);
  }

  // formatProblem reports a project of a format this version does not read
  // before the core is asked.
  function formatProblem(obj) {
    if (!isObject(obj)) {
      return "it is not a setcard/1 project object";
    }
    const f = obj.format;
    if (typeof f !== "string") {
      return "it has no \u201cformat\u201d: \u201csetcard/1\u201d";
    }
    const m = /^setcard\/(\d+)$/.exec(f);
    if (m && Number(m[1]) > 1) {
      return "its format \u201c" + f + "\u201d is from a newer version of Setcard; this version reads \u201csetcard/1\u201d";
    }
    if (f !== FORMAT) {
      return "its format \u201c" + shorten(f, 40) + "\u201d is not one this version reads (\u201csetcard/1\u201d)";
    }
    return "";
  }

  // importProject checks a project text and, when good, adds it as a new
  // project and opens it. Otherwise it says why and changes nothing.
  function importProject(text, what) {
    if (!core) {
      notify("Cannot open " + what + " yet: the calculation program has not started.", "error");
      return false;
    }
    const obj = parseJSON(text);
    if (obj === undefined) {
      let detail = "";
      try {
        JSON.parse(text);
      } catch (e) {
        detail = " (" + shorten(String(e.message).replace(/\s+/g, " "), 100) + ")";
      }
      notify("Could not open " + what + ": it is not valid JSON" + detail + ". The current project is unchanged.", "error");
      return false;
    }
    const fp = formatProblem(obj);
    if (fp) {
      notify("Could not open " + what + ": " + fp + ". The current project is unchanged.", "error");
      return false;
    }
    const r = result(callJSON("check", text));
    if (!r.ok) {
      notify("Could not open " + what + ": " + r.errors.map(plainError).join("; ") + ". The current project is unchanged.", "error");
      return false;
    }
    const id = addProject(obj, null);
    if (!openProject(id)) {
      return false;
    }
    notify("Opened " + what + " as the project \u201c" + projectName(current) + "\u201d.", "info");
    return true;
  }

  function openFile(file) {
    const what = "\u201c" + shorten(file.name, 60) + "\u201d";
    if (file.size > MAX_FILE_BYTES) {
      notify("Could not open " + what + ": it is larger than 1 MiB. The current project is unchanged.", "error");
      return;
    }
    const reader = new FileReader();
    reader.onload = () => importProject(String(reader.result), what);
    reader.onerror = () => notify("Could not read " + what + ". The current project is unchanged.", "error");
    reader.readAsText(file);
  }

  function toBase64url(text) {
    const bytes = new TextEncoder().encode(text);
    let bin = "";
    for (let i = 0; i < bytes.length; i += 0x8000) {
      bin += String.fromCharCode.apply(null, bytes.subarray(i, i + 0x8000));
    }
    return btoa(bin).replace(/\+/g, "-").replace(/\//g, "_").replace(/=+$/, "");
  }

  function fromBase64url(s) {
    if (!/^[A-Za-z0-9_-]*$/.test(s)) {
      throw new Error("it holds characters that base64url does not use");
    }
    let b = s.replace(/-/g, "+").replace(/_/g, "/");
    while (b.length % 4) {
      b += "=";
    }
    const bin = atob(b);
    const bytes = new Uint8Array(bin.length);
    for (let i = 0; i < bin.length; i++) {
      bytes[i] = bin.charCodeAt(i);
    }
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  }

  function shareLink() {
    const url = new URL(window.location.href);
    url.hash = "p=1." + toBase64url(JSON.stringify(current));
    return url.href;
  }

  function copyShareLink() {
    if (!current) {
      return;
    }
    const link = shareLink();
    const fallback = () => {
      el.shareFallback.hidden = false;
      el.shareLink.value = link;
      el.shareLink.focus();
      el.shareLink.select();
      notify("The browser did not allow copying: the link is shown in the tool bar above; copy it from there.", "info");
    };
    try {
      if (!navigator.clipboard || !navigator.clipboard.writeText) {
        throw new Error("no clipboard");
      }
      navigator.clipboard.writeText(link).then(() => {
        el.shareFallback.hidden = true;
        notify("Share link copied. It carries the whole project; anyone who opens it gets a copy.", "info");
      }, fallback);
    } catch (e) {
      fallback();
    }
  }

  // handleHash opens a project carried in the URL fragment: #p=1.<base64url
  // of the project JSON>. The fragment is removed afterwards, so that a
  // reload does not open it again.
  function handleHash() {
    const h = window.location.hash;
    if (!h.startsWith("#p=")) {
      return;
    }
    const body = h.slice(3);
    try {
      history.replaceState(null, "", window.location.pathname + window.location.search);
    } catch (e) {
      // ignore: the link may then open again on reload
    }
    const dot = body.indexOf(".");
    const version = dot < 0 ? "" : body.slice(0, dot);
    if (version !== "1") {
      const newer = /^\d+$/.test(version) && Number(version) > 1;
      notify("Could not open the share link: " + (newer ? "it was made by a newer version of Setcard (link version " + version + ")" : "it is not a Setcard share link this version reads") + ". The current project is unchanged.", "error");
      return;
    }
    let text;
    try {
      text = fromBase64url(body.slice(dot + 1));
    } catch (e) {
      notify("Could not open the share link: it is damaged (" + String(e && e.message ? e.message : e) + "). The current project is unchanged.", "error");
      return;
    }
    importProject(text, "the share link");
  }

  // ---------------------------------------------------------------------
  // Units switch.

  function setUnits(u, save) {
    if (u !== "si" && u !== "us") {
      u = "si";
    }
    const old = units;
    units = u;
    el.unitsSI.checked = u === "si";
    el.unitsUS.checked = u === "us";
    if (save) {
      storageSet(KEY_UNITS, u);
    }
    for (const span of document.querySelectorAll(".unit")) {
      const input = $(span.id.replace(/-unit$/, ""));
      if (input && input.dataset.q) {
        span.textContent = unitLabel(input.dataset.q);
      }
    }
    for (const f of fields()) {
      if (f.dataset.kind !== "num") {
        continue;
      }
      setLimitAttrs(f);
      if (old === u) {
        continue;
      }
      const c = shown.get(f);
      if (c && f.value === c.text) {
        setNum(f, c.si);
      } else {
        f.value = convertText(f.value, f.dataset.q, old, u);
      }
    }
    if (old !== u) {
      renderTable();
      if (formHasErrors) {
        validateAndApply();
      }
    }
  }

  // ---------------------------------------------------------------------
  // SVG from the core: the no-WebGL chart and the printed card.

  function svgNode(text) {
    if (typeof text !== "string" || text === "") {
      return null;
    }
    const doc = new DOMParser().parseFromString(text, "image/svg+xml");
    const root = doc.documentElement;
    if (!root || root.nodeName.toLowerCase() !== "svg" || doc.getElementsByTagName("parsererror").length > 0) {
      return null;
    }
    // The SVG is the core's own, but it carries user text: keep it inert.
    for (const s of Array.from(root.querySelectorAll("script, foreignObject"))) {
      s.remove();
    }
    for (const n of [root, ...root.querySelectorAll("*")]) {
      for (const a of Array.from(n.attributes)) {
        const v = a.value.trim().toLowerCase();
        if (a.name.toLowerCase().startsWith("on") || ((a.localName === "href") && !v.startsWith("#") && !v.startsWith("data:"))) {
          n.removeAttribute(a.name);
        }
      }
    }
    return document.importNode(root, true);
  }

  function renderSVGChart() {
    if (!core || !noGL) {
      return;
    }
    const box = el.chartSvg.clientWidth > 0 ? el.chartSvg : el.chartBox;
    const w = Math.max(200, Math.round(box.clientWidth));
    const h = Math.max(150, Math.round(box.clientHeight));
    const node = svgNode(call("chartSVG", w, h));
    if (!node) {
      return;
    }
    node.setAttribute("width", String(w));
    node.setAttribute("height", String(h));
    node.setAttribute("focusable", "false");
    el.chartSvg.replaceChildren(node);
    if (!ready && initialApplied) {
      setReady();
    }
  }

  const scheduleSVG = debounce(renderSVGChart, 30);

  function showNoGL() {
    noGL = true;
    el.frame.hidden = true;
    el.frame.setAttribute("tabindex", "-1");
    el.chartNotice.hidden = false;
    el.chartSvg.hidden = false;
    el.chartBox.classList.add("no-gl");
    $("chart-hint").textContent = "Change the inputs to move the chart.";
  }

  function fillPrintArea(quiet) {
    if (!core) {
      if (!quiet) {
        notify("The card cannot be printed yet: the calculation program has not started.", "error");
      }
      return false;
    }
    const paper = el.paper.value === "letter" ? "letter" : "a4";
    const node = svgNode(call("cardSVG", paper));
    if (!node) {
      if (!quiet) {
        notify("The card could not be drawn for printing.", "error");
      }
      return false;
    }
    node.removeAttribute("width");
    node.removeAttribute("height");
    node.setAttribute("preserveAspectRatio", "xMidYMid meet");
    el.printArea.replaceChildren(node);
    document.body.classList.remove("print-a4", "print-letter");
    document.body.classList.add("print-" + paper);
    return true;
  }

  const scheduleCard = debounce(() => fillPrintArea(true), 300);

  function printCard() {
    scheduleCard.cancel();
    if (formHasErrors) {
      notify("Printing the last valid project: some inputs are marked and were not applied.", "info");
    }
    if (fillPrintArea(false)) {
      window.print();
    }
  }

  // ---------------------------------------------------------------------
  // The chart program's callbacks.

  function frameWindow() {
    try {
      return el.frame.contentWindow;
    } catch (e) {
      return null;
    }
  }

  let pollTimer = 0;
  let pollCount = 0;
  function pollCore() {
    const w = frameWindow();
    if (w && w.setcardCore && !core) {
      onCoreReady();
    } else if (w && w.setcardFailed && !coreDead) {
      onCoreFailed(String(w.setcardFailed));
    }
    pollCount++;
    if (pollCount === 300 && !core && !coreDead) {
      el.chartStatus.textContent = "The chart is still starting…";
    }
    if (!core && !coreDead) {
      pollTimer = setTimeout(pollCore, 100);
    }
  }

  function onCoreReady() {
    if (core) {
      return;
    }
    const w = frameWindow();
    if (!w || !w.setcardCore) {
      return;
    }
    clearTimeout(pollTimer);
    core = w.setcardCore;
    const l = callJSON("limits");
    if (isObject(l)) {
      limits = Object.assign({}, FALLBACK_LIMITS, l);
    }
    for (const f of fields()) {
      if (f.dataset.kind === "num") {
        setLimitAttrs(f);
      }
    }
    if (w.setcardNoGL || pendingNoCanvas) {
      showNoGL();
    }
    openFirstValid();
    renderProjectList();
    handleHash();
    initialApplied = true;
    framesAtApply = Number(call("frames"));
    if (noGL) {
      renderSVGChart();
    } else {
      el.chartStatus.textContent = "Drawing the chart…";
      checkReady();
    }
  }

  function onCoreFailed(message) {
    if (coreDead) {
      return;
    }
    coreDead = true;
    clearTimeout(pollTimer);
    el.chartStatus.hidden = false;
    el.chartStatus.textContent = "The chart could not start: " + message;
    notify("The calculation program could not start (" + message + "). Your projects are kept in this browser; reload the page to try again.", "error");
  }

  let pendingNoCanvas = false;
  function onNoCanvas(message) {
    console.error("setcard: the canvas could not start: " + message);
    if (!core) {
      pendingNoCanvas = true;
      return;
    }
    if (!noGL) {
      showNoGL();
      renderSVGChart();
    }
  }

  function onLeaveCanvas() {
    setTimeout(() => {
      el.chartBox.classList.toggle("frame-focus", document.activeElement === el.frame && document.hasFocus());
    }, 0);
  }

  function onFirstDraw() {
    firstDrawSeen = true;
    checkReady();
  }

  function checkReady() {
    if (ready || !initialApplied || !firstDrawSeen) {
      return;
    }
    const f = Number(call("frames"));
    if (!Number.isFinite(f) || !Number.isFinite(framesAtApply) || f > framesAtApply) {
      setReady();
    } else {
      setTimeout(checkReady, 30);
    }
  }

  function setReady() {
    ready = true;
    el.chartStatus.hidden = true;
    el.chartStatus.textContent = "";
  }

  function onControlChanged(json) {
    const p = parseJSON(json);
    if (!isObject(p) || !core) {
      return;
    }
    const old = current || {};
    current = p;
    currentJSON = JSON.stringify(buildComparable(p));
    const nDrops = Array.isArray(p.drops_m) ? p.drops_m.length : 0;
    if (nDrops !== dropInputs().length) {
      renderDrops(Math.max(1, nDrops));
      for (const f of dropInputs()) {
        renderField(f, p);
      }
    }
    for (const f of fields()) {
      if (f.dataset.kind !== "num") {
        continue;
      }
      const a = projectValue(p, f);
      const b = projectValue(old, f);
      if (a !== b) {
        renderField(f, p);
        const m = msgOf(f);
        if (m) {
          m.textContent = "";
        }
        f.removeAttribute("aria-invalid");
      }
    }
    rows = readRows();
    renderTable();
    updateProjectName();
    items.set(currentId, { project: current, draft: formHasErrors ? captureDraft() : null });
    writeLater();
    scheduleCard();
  }

  // leaveChart moves focus from the chart to the next (or previous)
  // control of the page.
  function leaveChart(backwards) {
    const all = Array.from(document.querySelectorAll("a[href], button, input, select, textarea, iframe, [tabindex]"))
      .filter((n) => !n.disabled && n.tabIndex >= 0 && !n.closest("[hidden]") && n.getClientRects().length > 0);
    const i = all.indexOf(el.frame);
    const next = all[backwards ? i - 1 : i + 1];
    window.focus();
    if (next) {
      next.focus();
    }
  }

  // ---------------------------------------------------------------------
  // Test hook: read only.

  function stateForTests() {
    const out = { project: null, rows: [], controls: [], timings: null };
    if (!core) {
      out.project = current ? clone(current) : null;
      return out;
    }
    const p = callJSON("project");
    out.project = isObject(p) ? p : null;
    const r = callJSON("rows");
    out.rows = r && Array.isArray(r.rows) ? r.rows : [];
    const c = callJSON("controls");
    const rect = el.frame.getBoundingClientRect();
    const dx = rect.left + el.frame.clientLeft;
    const dy = rect.top + el.frame.clientTop;
    out.controls = Array.isArray(c) ? c.map((k) => Object.assign({}, k, { x: Number(k.x) + dx, y: Number(k.y) + dy })) : [];
    const t = callJSON("timings");
    out.timings = isObject(t) ? t : null;
    return out;
  }

  const hook = {};
  Object.defineProperty(hook, "ready", { enumerable: true, get: () => ready });
  Object.defineProperty(hook, "state", { enumerable: true, value: () => stateForTests() });
  Object.freeze(hook);
  Object.defineProperty(window, "setcard", { enumerable: true, configurable: false, writable: false, value: hook });

  // ---------------------------------------------------------------------
  // Wiring.

  function onFieldEvent(ev) {
    const t = ev.target;
    if (!(t instanceof HTMLElement) || !el.form.contains(t)) {
      return;
    }
    if (!core) {
      saveDraftOnly();
      return;
    }
    if (ev.type === "input" && (t.tagName === "INPUT" && t.type === "text" || t.tagName === "TEXTAREA")) {
      scheduleValidate();
      return;
    }
    if (ev.type === "change") {
      if (t.id === "f-pile-section") {
        onSectionChange();
        return;
      }
      if (t.id === "f-design-convention") {
        onConventionChange();
        return;
      }
      if (t.id === "f-compression-method") {
        updateVisibility();
      }
      validateAndApply();
    }
  }

  function wire() {
    el.form.addEventListener("submit", (ev) => {
      ev.preventDefault();
      validateAndApply();
    });
    el.form.addEventListener("input", onFieldEvent);
    el.form.addEventListener("change", onFieldEvent);
    el.dropsAdd.addEventListener("click", addDrop);
    el.copyTable.addEventListener("click", copyTable);
    el.projectList.addEventListener("change", () => {
      const id = el.projectList.value;
      if (id === currentId) {
        return;
      }
      scheduleValidate.flush();
      saveCurrent(false);
      if (!openProject(id)) {
        el.projectList.value = currentId;
      }
    });
    el.projectNew.addEventListener("click", newProject);
    el.projectRename.addEventListener("click", renameProject);
    el.projectDuplicate.addEventListener("click", duplicateProject);
    el.projectDelete.addEventListener("click", deleteProject);
    el.fileOpen.addEventListener("click", () => el.fileInput.click());
    el.fileInput.addEventListener("change", () => {
      const file = el.fileInput.files && el.fileInput.files[0];
      if (file) {
        openFile(file);
      }
      el.fileInput.value = "";
    });
    el.fileSave.addEventListener("click", saveFile);
    el.shareCopy.addEventListener("click", copyShareLink);
    el.unitsSI.addEventListener("change", () => setUnits("si", true));
    el.unitsUS.addEventListener("change", () => setUnits("us", true));
    el.paper.addEventListener("change", () => {
      storageSet(KEY_PAPER, el.paper.value);
      fillPrintArea(true);
    });
    el.print.addEventListener("click", printCard);
    window.addEventListener("beforeprint", () => {
      scheduleCard.cancel();
      fillPrintArea(true);
    });
    window.addEventListener("hashchange", () => {
      if (core) {
        handleHash();
      }
    });
    window.addEventListener("resize", () => {
      if (noGL) {
        scheduleSVG();
      }
    });
    // An iframe whose document holds the focus does not match :focus in
    // this document, so the outline is drawn through a class.
    const frameFocus = () => {
      el.chartBox.classList.toggle("frame-focus", document.activeElement === el.frame && document.hasFocus());
    };
    const frameFocusSoon = () => setTimeout(frameFocus, 0);
    window.addEventListener("blur", frameFocusSoon);
    window.addEventListener("focus", frameFocusSoon);
    document.addEventListener("focusin", frameFocusSoon);
    document.addEventListener("focusout", frameFocusSoon);
    const flush = () => {
      scheduleValidate.flush();
      writeLater.flush();
    };
    window.addEventListener("pagehide", flush);
    document.addEventListener("visibilitychange", () => {
      if (document.visibilityState === "hidden") {
        flush();
      }
    });
  }

  function init() {
    wire();
    const u = storageGet(KEY_UNITS);
    const paper = storageGet(KEY_PAPER);
    if (paper === "a4" || paper === "letter") {
      el.paper.value = paper;
    }
    document.body.classList.add("print-" + el.paper.value);
    units = u === "us" ? "us" : "si";
    setUnits(units, false);
    loadStorage();
    const it = items.get(currentId);
    current = it ? it.project : clone(DEMO);
    renderForm(current, it ? it.draft : null);
    if (it && it.draft) {
      const { bad } = buildProject();
      for (const b of bad) {
        addMessage(b.f, b.message);
      }
    }
    renderProjectList();
    renderTable();
    if ("serviceWorker" in navigator) {
      navigator.serviceWorker.register("sw.js").catch(() => {});
    }
    pollCore();
  }

  init();
})();
