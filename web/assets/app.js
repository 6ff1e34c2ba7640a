"use strict";
// termwright serve: the page's script. Plain DOM, no framework: the page is
// a handful of lists and tables redrawn from the JSON API.

const S = { term: null, state: null, subject: null, picked: null, lastMove: null, versions: [] };
const $ = (id) => document.getElementById(id);

function el(tag, attrs, ...kids) {
  const e = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs || {})) {
    if (k === "text") e.textContent = v;
    else if (k.startsWith("on")) e.addEventListener(k.slice(2), v);
    else if (v !== null && v !== undefined && v !== false) e.setAttribute(k, v === true ? "" : v);
  }
  for (const k of kids) if (k !== null && k !== undefined) e.append(k);
  return e;
}

async function api(method, path, body) {
  const opt = { method, headers: {} };
  if (body !== undefined) { opt.headers["Content-Type"] = "application/json"; opt.body = JSON.stringify(body); }
  const r = await fetch(path, opt);
  const data = await r.json().catch(() => ({ error: "the server sent an answer that is not JSON (status " + r.status + ")" }));
  if (!r.ok) { const e = new Error(data.error || ("status " + r.status)); e.status = r.status; e.data = data; throw e; }
  return data;
}

function notice(msg, isError) {
  const n = $("notice");
  n.textContent = "";
  n.className = isError ? "error" : "";
  if (!msg) return;
  n.append(el("span", { text: (isError ? "Problem: " : "") + msg }));
  if (isError && msg.includes("reload")) n.append(" ", el("button", { type: "button", onclick: () => location.reload(), text: "Reload now" }));
}

async function load() {
  try {
    S.term = await api("GET", "/api/term");
    S.state = await api("GET", "/api/state");
    await loadVersions();
  } catch (e) { notice(e.message, true); return; }
  $("term-name").textContent = S.term.name || "Timetable";
  document.title = (S.term.name || "Timetable") + " — termwright";
  drawAll();
  const q = new URLSearchParams(location.search).get("find");
  if (q) { $("find").value = q; drawMatches(); }
}

async function loadVersions() {
  const v = await api("GET", "/api/versions");
  S.versions = v.versions;
  drawVersions();
}

function drawAll() {
  $("version").textContent = "(edit " + S.state.version + ")";
  $("undo").disabled = !S.state.can_undo;
  drawHealth();
  drawMaster();
  drawGrid();
}

// ---- search ----
function subjects() {
  const t = S.term, out = [];
  for (const s of t.staff || []) out.push({ kind: "staff", id: s.id, label: s.name ? s.name + " (" + s.id + ")" : s.id });
  for (const r of t.rooms || []) out.push({ kind: "room", id: r.id, label: r.id + (r.detail ? " — " + r.detail : "") });
  for (const c of t.cohorts || []) out.push({ kind: "cohort", id: c.id, label: c.name && c.name !== c.id ? c.name + " (" + c.id + ")" : c.id });
  for (const s of t.students || []) out.push({ kind: "student", id: s.id, label: s.id });
  return out;
}

function drawMatches() {
  const q = $("find").value.trim().toLowerCase(), ul = $("matches");
  ul.textContent = "";
  if (!q) return;
  const hits = subjects().filter((s) => s.label.toLowerCase().includes(q)).slice(0, 40);
  if (!hits.length) { ul.append(el("li", { text: "Nothing matches “" + q + "”." })); return; }
  for (const s of hits) {
    ul.append(el("li", {}, el("button", { type: "button", "data-kind": s.kind, "data-id": s.id, onclick: () => choose(s) },
      el("span", { class: "kind", text: s.kind }), s.label)));
  }
}

function choose(s) { S.subject = s; S.picked = null; drawGrid(); $("grid-h").focus(); }

// ---- week grid ----
function attends(m, s) {
  switch (s.kind) {
    case "staff": return m.staff.includes(s.id);
    case "room": return m.room === s.id;
    case "cohort": return m.cohorts.includes(s.id);
    case "student": return (S.term.enrolled[s.id] || []).includes(m.section);
  }
  return false;
}

function periodAt(day, start) {
  return S.term.periods.find((p) => p.day === day && p.start === start);
}

function meetingLabel(m) { return m.section + " meeting " + m.meeting + (m.title ? " (" + m.title + ")" : ""); }

function drawGrid() {
  const wrap = $("grid-wrap"), s = S.subject;
  wrap.textContent = "";
  $("grid-h").setAttribute("tabindex", "-1");
  drawPicked();
  if (!s) return;
  $("grid-h").textContent = "Week of " + s.kind + " " + s.label;
  const mine = S.state.meetings.filter((m) => attends(m, s));
  const byPeriod = new Map();
  for (const m of mine) m.periods.forEach((p, i) => { if (!byPeriod.has(p)) byPeriod.set(p, []); byPeriod.get(p).push({ m, first: i === 0 }); });
  const table = el("table", { class: "grid", id: "grid" });
  table.append(el("caption", { text: mine.length + " meetings. " + (S.picked ? "Choose a cell for " + meetingLabel(S.picked) + "." : "Choose a meeting to move it.") }));
  const head = el("tr", {}, el("th", { scope: "col", text: "Time" }));
  for (const d of S.term.days) head.append(el("th", { scope: "col", text: d }));
  table.append(el("thead", {}, head));
  const body = el("tbody");
  for (const t of S.term.times) {
    const tr = el("tr", {}, el("th", { scope: "row", text: t.start + "–" + t.end }));
    for (const d of S.term.days) {
      const p = periodAt(d, t.start);
      const td = el("td", {});
      if (p) {
        td.dataset.period = p.index;
        for (const { m, first } of byPeriod.get(p.index) || []) {
          if (!first) { td.append(el("div", { class: "cont", text: m.section + " continues" })); continue; }
          const pressed = S.picked && S.picked.index === m.index;
          td.append(el("button", { type: "button", class: "mtg", "data-section": m.section, "data-meeting": m.meeting, "aria-pressed": pressed ? "true" : "false",
            "aria-label": meetingLabel(m) + ", " + m.day + " " + m.start + "–" + m.end + ", " + (m.no_room ? "no room" : "room " + m.room) + (pressed ? ", chosen for moving" : ""),
            draggable: "true", ondragstart: (e) => { e.dataTransfer.setData("text/plain", String(m.index)); pick(m, false); },
            onclick: (e) => { e.stopPropagation(); pressed ? unpick() : pick(m, true); } },
            m.section + " " + m.start + "–" + m.end, el("small", { text: (m.title || "") + " · " + (m.no_room ? "no room" : m.room) + (m.weeks ? " · weeks " + m.weeks : "") })));
        }
        if (S.picked && !(S.picked.period === p.index && !movesRoom())) {
          td.classList.add("target");
          td.append(el("button", { type: "button", class: "here", "data-period": p.index, "aria-label": "Move " + meetingLabel(S.picked) + " to " + p.label,
            onclick: (e) => { e.stopPropagation(); move(p.index, false); }, text: "Move here" }));
          td.addEventListener("click", () => move(p.index, false));
        }
        td.addEventListener("dragover", (e) => e.preventDefault());
        td.addEventListener("drop", (e) => { e.preventDefault(); if (S.picked) move(p.index, false); });
      } else td.append(el("span", { class: "cont", text: "not in the grid" }));
      tr.append(td);
    }
    body.append(tr);
  }
  table.append(body);
  wrap.append(table);
}

// movesRoom says the pending move changes the room (a room chosen, or the
// week shown is another room's), so the meeting's own cell is a target too.
function movesRoom() {
  const chosen = $("room-choice").value, m = S.picked;
  return !!chosen || (S.subject && S.subject.kind === "room" && m && m.room !== S.subject.id);
}

function pick(m, focus) {
  S.picked = m;
  drawGrid();
  if (focus) { const b = document.querySelector(".here"); if (b) b.focus(); }
}
function unpick() { S.picked = null; $("room-choice").dataset.for = ""; drawGrid(); }

function drawPicked() {
  const box = $("picked"), m = S.picked;
  box.hidden = !m;
  if (!m) return;
  $("picked-text").textContent = "Moving " + meetingLabel(m) + " from " + m.day + " " + m.start + (m.no_room ? "" : " in " + m.room) + ". Choose a cell with “Move here”, or press Esc.";
  const sel = $("room-choice"), key = m.index + "/" + (S.subject ? S.subject.kind + ":" + S.subject.id : "");
  if (sel.dataset.for === key) return; // same meeting and week: keep the room chosen
  sel.dataset.for = key;
  sel.textContent = "";
  sel.disabled = m.no_room;
  const keep = S.subject && S.subject.kind === "room" ? S.subject.id : m.room;
  sel.append(el("option", { value: "", text: m.no_room ? "no room (online or off-site)" : "keep " + (keep || "no room") }));
  if (!m.no_room) for (const r of S.term.rooms) if (r.id !== keep) sel.append(el("option", { value: r.id, text: r.id + " — " + r.detail }));
}

async function move(period, force) {
  const m = S.picked;
  if (!m) return;
  const body = { version: S.state.version, section: m.section, meeting: m.meeting, period, force };
  const chosen = $("room-choice").value;
  if (chosen) body.room = chosen;
  else if (S.subject && S.subject.kind === "room" && !m.no_room) body.room = S.subject.id;
  try {
    const res = await api("POST", "/api/move", body);
    S.state = res.state;
    S.lastMove = { period, body };
    if (res.applied) { S.picked = null; $("room-choice").dataset.for = ""; }
    drawAll();
    drawVerdict(res, period);
    notice(res.applied ? "Moved: " + res.what + "." : "");
  } catch (e) { notice(e.message, true); }
}

function drawVerdict(res, period) {
  const v = $("verdict");
  v.hidden = false;
  v.textContent = "";
  v.className = "verdict " + (res.legal ? "legal" : "illegal");
  v.append(el("p", {}, el("span", { class: "tag", text: res.legal ? "Allowed. " : "Not allowed. " }), res.what + (res.applied ? " — done." : " — not moved.")));
  if (res.reasons.length) {
    v.append(el("p", { text: "It would break " + res.reasons.length + " hard requirement" + (res.reasons.length > 1 ? "s" : "") + ":" }));
    v.append(el("ul", { class: "problems" }, ...res.reasons.map((r) => el("li", {}, el("strong", { text: r.rule + ": " }), r.msg))));
  }
  if (res.cost.length) {
    const t = el("table", {}, el("caption", { text: "Change in cost" }), el("tr", {}, el("th", { text: "Preference" }), el("th", { text: "Before" }), el("th", { text: "After" }), el("th", { text: "Change" })));
    for (const c of res.cost) t.append(el("tr", {}, el("td", { text: c.name }), el("td", { class: "num", text: c.before }), el("td", { class: "num", text: c.after }), el("td", { class: "num", text: (c.after - c.before > 0 ? "+" : "") + (c.after - c.before) })));
    v.append(t);
  } else v.append(el("p", { text: "No change in cost." }));
  if (res.levels && res.levels.length) v.append(el("p", { text: "Total cost by level (highest first): " + res.levels.map((l) => "level " + l.level + " " + l.before + " → " + l.after).join("; ") + "." }));
  if (!res.applied) {
    v.append(el("button", { type: "button", id: "force", onclick: () => move(period, true), text: "Place it anyway (breaks the requirements above)" }), " ",
      el("button", { type: "button", id: "ask-why", onclick: () => whyNot(period), text: "Why not, and where else could it go?" }));
    v.append(el("div", { id: "whynot", "aria-live": "polite" }));
  }
  if (res.applied) v.append(el("button", { type: "button", onclick: undo, text: "Undo this move" }));
}

// whyNot asks the explanation engine whether any timetable of the term
// can have the picked meeting's section at period, and where else it could go.
async function whyNot(period) {
  const m = S.picked, out = $("whynot");
  if (!m || !out) return;
  out.textContent = "Searching every timetable of the term (this can take a few seconds)…";
  let q = "/api/whynot?section=" + encodeURIComponent(m.section) + "&period=" + period;
  const chosen = $("room-choice").value;
  if (chosen) q += "&room=" + encodeURIComponent(chosen);
  try {
    const a = await api("GET", q);
    out.textContent = "";
    if (a.granted) {
      out.append(el("p", { text: "Some timetable of the term does have " + a.request + ": the clash is with this timetable's other meetings, which would have to move." }));
      return;
    }
    out.append(el("p", {}, el("strong", { text: "No timetable of the term can have " + a.request + "." }), a.reasons.length ? " These requirements cannot all hold" + (a.minimal ? " (drop any one and the rest can):" : ":") : ""));
    if (a.reasons.length) out.append(el("ul", { class: "problems", id: "whynot-reasons" }, ...a.reasons.map((r) => el("li", {}, r.sentence + (r.where ? " (" + r.where + ")" : "")))));
    if (a.places.length) {
      out.append(el("p", { text: "It could go instead at" + (a.complete ? "" : " (not every time was tried)") + ":" }));
      out.append(el("ul", { id: "whynot-places" }, ...a.places.map((p) => el("li", {}, p.at + (p.room ? " in " + p.room : "") + " ",
        el("button", { type: "button", onclick: () => move(p.period, false), "aria-label": "Try moving " + meetingLabel(m) + " to " + p.at, text: "Try this" })))));
    } else out.append(el("p", { text: "No other time was found for it." }));
    if (a.uncertain) out.append(el("p", { text: "Note: " + a.uncertain }));
  } catch (e) { out.textContent = "Problem: " + e.message; }
}

async function undo() {
  try {
    S.state = await api("POST", "/api/undo", { version: S.state.version });
    S.picked = null;
    drawAll();
    $("verdict").hidden = true;
    notice("The last move was undone.");
  } catch (e) { notice(e.message, true); }
}

async function save() {
  try {
    const res = await api("POST", "/api/save", { version: S.state.version });
    S.versions = res.versions;
    drawVersions();
    notice("Saved as " + res.saved.file + " (version " + res.saved.id + ")" + (res.saved.hard ? "; it breaks " + res.saved.hard + " hard requirements" : "") + ".");
  } catch (e) { notice(e.message, true); }
}

// ---- requirements and cost ----
function drawHealth() {
  const h = $("hard"), st = S.state;
  h.textContent = "";
  if (!st.hard || !st.hard.length) h.append(el("p", { class: "ok" }, el("strong", { text: "All hard requirements hold." })));
  else {
    h.append(el("p", {}, el("strong", { text: st.hard.length + " hard requirement" + (st.hard.length > 1 ? "s" : "") + " broken:" })));
    h.append(el("ul", { class: "problems", id: "hard-list" }, ...st.hard.map((p) => el("li", {}, el("strong", { text: p.rule + ": " }), p.msg))));
  }
  if (st.soft && st.soft.length) h.append(el("p", { text: st.soft.length + " student clash" + (st.soft.length > 1 ? "es" : "") + " (a preference)." }));
  const c = $("cost");
  c.textContent = "";
  const t = el("table", { id: "cost-table" }, el("caption", { text: "Cost per preference" }), el("tr", {}, el("th", { scope: "col", text: "Preference" }), el("th", { scope: "col", text: "Level" }), el("th", { scope: "col", text: "Count" }), el("th", { scope: "col", text: "Cost" })));
  for (const cr of st.cost.criteria) t.append(el("tr", {}, el("td", { text: cr.name }), el("td", { class: "num", text: cr.level }), el("td", { class: "num", text: cr.count }), el("td", { class: "num", text: cr.cost })));
  for (const l of st.cost.levels) t.append(el("tr", {}, el("th", { scope: "row", colspan: "3", text: "Total at level " + l.level }), el("td", { class: "num", text: l.cost })));
  c.append(t);
}

// ---- master list ----
function staffName(id) {
  if (!S.staffNames) S.staffNames = new Map((S.term.staff || []).map((s) => [s.id, s.name]));
  const n = S.staffNames.get(id);
  return n ? n + " (" + id + ")" : id;
}

function drawMaster() {
  const q = $("filter").value.trim().toLowerCase(), tb = $("master").tBodies[0];
  tb.textContent = "";
  let n = 0;
  for (const m of S.state.meetings) {
    const cells = [m.section, m.title, String(m.meeting), m.day, m.start + "–" + m.end, m.no_room ? "no room" : m.room, m.staff.map(staffName).join(", "), m.cohorts.join(", ")];
    if (q && !cells.join(" ").toLowerCase().includes(q)) continue;
    n++;
    tb.append(el("tr", {}, ...cells.map((c, i) => el("td", { class: i === 0 || i === 4 ? "nowrap" : null, text: c }))));
  }
  $("master-count").textContent = n + " of " + S.state.meetings.length + " meetings shown.";
}

// ---- versions ----
function drawVersions() {
  const ol = $("version-list");
  ol.textContent = "";
  if (!S.versions.length) ol.append(el("li", { text: "Nothing saved yet: the timetable was solved when the page started." }));
  for (const v of S.versions) ol.append(el("li", { text: v.file + " (edit " + v.edit + (v.saved ? ", saved " + new Date(v.saved).toLocaleTimeString() : ", as loaded") + ")" }));
  for (const id of ["cmp-old", "cmp-new"]) {
    const sel = $(id), was = sel.value;
    sel.textContent = "";
    for (const v of S.versions) sel.append(el("option", { value: String(v.id), text: v.id + ": " + v.file }));
    sel.append(el("option", { value: "current", text: "current (unsaved edits)" }));
    if (was) sel.value = was;
    if (!sel.value && sel.options.length) sel.value = id === "cmp-new" ? "current" : sel.options[0].value;
  }
  if (!$("cmp-new").dataset.touched) $("cmp-new").value = "current";
}

async function compare(ev) {
  ev.preventDefault();
  const out = $("compare-out");
  out.textContent = "";
  try {
    const c = await api("GET", "/api/compare?old=" + encodeURIComponent($("cmp-old").value) + "&new=" + encodeURIComponent($("cmp-new").value));
    out.append(el("p", { text: c.old + " → " + c.new + ": " + c.moved + " moved, " + c.added + " added, " + c.dropped + " dropped, " + c.unchanged + " unchanged." }));
    if (!c.affected.length) { out.append(el("p", { text: "No one's week changed." })); return; }
    for (const a of c.affected) {
      out.append(el("h3", { text: a.kind + " " + (a.name ? a.name + " (" + a.id + ")" : a.id) }));
      out.append(el("ul", {}, ...a.changes.map((ch) => el("li", { text: ch.section + (ch.title ? " " + ch.title : "") + ": " + ch.change + " — " + [ch.from, ch.to].filter(Boolean).join(" → ") }))));
    }
  } catch (e) { notice(e.message, true); }
}

document.addEventListener("DOMContentLoaded", () => {
  $("find").addEventListener("input", drawMatches);
  $("filter").addEventListener("input", drawMaster);
  $("undo").addEventListener("click", undo);
  $("save").addEventListener("click", save);
  $("cancel-pick").addEventListener("click", unpick);
  $("room-choice").addEventListener("change", drawGrid);
  $("cmp-new").addEventListener("change", (e) => { e.target.dataset.touched = "1"; });
  $("compare-form").addEventListener("submit", compare);
  document.addEventListener("keydown", (e) => { if (e.key === "Escape" && S.picked) unpick(); });
  load();
});
