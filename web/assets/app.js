"use strict";
// termwright serve: the page's script. Plain DOM, no framework: the page is
// a handful of lists and tables redrawn from the JSON API.

const S = { term: null, state: null, subject: null, picked: null, lastMove: null, versions: [], focus: { r: 0, c: 0 }, replanJob: null };
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
  $("locked-count").textContent = S.state.locked ? S.state.locked + " meeting" + (S.state.locked > 1 ? "s" : "") + " locked: they stay where they are." : "No meeting is locked: every meeting may move.";
  if (S.picked) S.picked = S.state.meetings.find((m) => m.section === S.picked.section && m.meeting === S.picked.meeting) || null;
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
  for (const s of S.state.students || t.students || []) out.push({ kind: "student", id: s.id, label: s.id });
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
    case "student": return ((S.state.enrolled || S.term.enrolled)[s.id] || []).includes(m.section);
  }
  return false;
}

function periodAt(day, start) {
  return S.term.periods.find((p) => p.day === day && p.start === start);
}

function meetingLabel(m) { return m.section + " meeting " + m.meeting + (m.title ? " (" + m.title + ")" : ""); }
function isPattern(m) { return !!(m && m.time); }
function whereText(m) { return m.day + " " + m.start + "–" + m.end + ", " + (m.no_room ? "no room" : "room " + m.room) + (m.weeks ? ", weeks " + m.weeks : ""); }

// cellsOf places each meeting of the week in the cells it overlaps by
// clock time: the key is "day|row"; first marks the cell it starts in.
function cellsOf(mine) {
  const out = new Map(), rows = S.term.times;
  for (const m of mine) for (const o of m.occ) {
    let first = true;
    rows.forEach((r, i) => {
      if (!(r.from < o.to && o.from < r.to)) return;
      const k = o.day + "|" + i;
      if (!out.has(k)) out.set(k, []);
      out.get(k).push({ m, first });
      first = false;
    });
  }
  return out;
}

function drawGrid() {
  const wrap = $("grid-wrap"), s = S.subject;
  const hadFocus = wrap.contains(document.activeElement) && document.activeElement.tagName === "TD";
  wrap.textContent = "";
  $("grid-h").setAttribute("tabindex", "-1");
  drawPicked();
  $("grid-keys").hidden = !s;
  if (!s) return;
  $("grid-h").textContent = "Week of " + s.kind + " " + s.label;
  if (s.kind === "student") {
    wrap.append(el("p", {}, el("button", { type: "button", id: "student-why", onclick: () => studentWhy(s.id), text: "Can " + s.id + " get every requested course without a clash?" })));
    wrap.append(el("div", { id: "student-out", role: "region", "aria-live": "polite", "aria-label": "Answer for student " + s.id }));
  }
  const mine = S.state.meetings.filter((m) => attends(m, s));
  const cells = cellsOf(mine), days = S.term.days, rows = S.term.times;
  S.focus.r = Math.min(S.focus.r, rows.length - 1); S.focus.c = Math.min(S.focus.c, days.length - 1);
  const p0 = S.picked, gridMove = p0 && !isPattern(p0) && !p0.locked;
  const table = el("table", { class: "grid", id: "grid", role: "grid", "aria-labelledby": "grid-h", "aria-describedby": "grid-keys" });
  table.append(el("caption", { text: mine.length + " meetings. " + (p0 ? (p0.locked ? meetingLabel(p0) + " is locked: unlock it to move it." : isPattern(p0) ? "Choose another pattern for " + meetingLabel(p0) + " above the grid." : "Choose a cell for " + meetingLabel(p0) + ".") : "Choose a meeting to move or lock it.") }));
  const head = el("tr", {}, el("th", { scope: "col", text: "Time" }));
  for (const d of days) head.append(el("th", { scope: "col", text: d }));
  table.append(el("thead", {}, head));
  const body = el("tbody");
  rows.forEach((t, ri) => {
    const tr = el("tr", {}, el("th", { scope: "row", text: t.start + "–" + t.end }));
    days.forEach((d, ci) => {
      const p = periodAt(d, t.start);
      const here = cells.get(d + "|" + ri) || [];
      const td = el("td", { role: "gridcell", tabindex: ri === S.focus.r && ci === S.focus.c ? "0" : "-1", "data-row": ri, "data-col": ci });
      const said = [];
      for (const { m, first } of here) {
        said.push(meetingLabel(m) + (first ? "" : " continues") + ", " + whereText(m) + (m.locked ? ", locked" : ""));
        if (!first) { td.append(el("div", { class: "cont", text: m.section + " continues" })); continue; }
        const pressed = p0 && p0.index === m.index;
        td.append(el("button", { type: "button", tabindex: "-1", class: "mtg" + (m.locked ? " locked" : ""), "data-section": m.section, "data-meeting": m.meeting, "aria-pressed": pressed ? "true" : "false",
          "aria-label": meetingLabel(m) + ", " + whereText(m) + (m.locked ? ", locked" : "") + (pressed ? ", chosen" : ""),
          draggable: m.locked ? "false" : "true", ondragstart: (e) => { e.dataTransfer.setData("text/plain", String(m.index)); pick(m, false); },
          onclick: (e) => { e.stopPropagation(); pressed ? unpick() : pick(m, true); } },
          m.locked ? el("span", { class: "lock-tag", text: "Locked" }) : null, m.locked ? " " : null,
          m.section + " " + m.start + "–" + m.end, el("small", { text: (m.title || "") + " · " + (m.no_room ? "no room" : m.room) + (m.weeks ? " · weeks " + m.weeks : "") })));
      }
      if (p) td.dataset.period = p.index;
      if (p && gridMove && !(p0.period === p.index && !movesRoom())) {
        td.classList.add("target");
        td.dataset.target = "1";
        td.append(el("button", { type: "button", tabindex: "-1", class: "here", "data-period": p.index, "aria-label": "Move " + meetingLabel(p0) + " to " + p.label,
          onclick: (e) => { e.stopPropagation(); move(p.index, false); }, text: "Move here" }));
        td.addEventListener("click", () => move(p.index, false));
      }
      if (p) {
        td.addEventListener("dragover", (e) => e.preventDefault());
        td.addEventListener("drop", (e) => { e.preventDefault(); if (S.picked) move(p.index, false); });
      } else if (!here.length) td.append(el("span", { class: "cont", text: "not in the grid" }));
      let label = d + " " + t.start + "–" + t.end + ": " + (said.length ? said.join("; ") : p ? "free" : "not in the grid");
      if (td.dataset.target) label += ". Press Enter to move " + meetingLabel(p0) + " here";
      td.setAttribute("aria-label", label);
      td.addEventListener("focus", () => { S.focus = { r: ri, c: ci }; for (const o of table.querySelectorAll("td[tabindex='0']")) if (o !== td) o.setAttribute("tabindex", "-1"); td.setAttribute("tabindex", "0"); });
      tr.append(td);
    });
    body.append(tr);
  });
  table.append(body);
  table.addEventListener("keydown", gridKey);
  wrap.append(table);
  if (hadFocus) focusCell();
}

function focusCell() {
  const td = document.querySelector('#grid td[data-row="' + S.focus.r + '"][data-col="' + S.focus.c + '"]');
  if (td) td.focus();
}

// gridKey: arrow keys move between cells, Home and End to the ends of a
// row; Enter or Space picks the cell's meeting or moves the picked one
// there; L locks or unlocks; W asks where else; Esc (on the document)
// cancels.
function gridKey(e) {
  const td = e.target.closest("td");
  if (!td || e.target !== td) return;
  const rows = S.term.times.length, cols = S.term.days.length;
  const f = S.focus;
  const go = { ArrowUp: [-1, 0], ArrowDown: [1, 0], ArrowLeft: [0, -1], ArrowRight: [0, 1] }[e.key];
  if (go) {
    e.preventDefault();
    f.r = Math.max(0, Math.min(rows - 1, f.r + go[0])); f.c = Math.max(0, Math.min(cols - 1, f.c + go[1]));
    focusCell();
    return;
  }
  if (e.key === "Home" || e.key === "End") { e.preventDefault(); f.c = e.key === "Home" ? 0 : cols - 1; focusCell(); return; }
  const mtgs = [...td.querySelectorAll("button.mtg")].map((b) => S.state.meetings.find((m) => m.section === b.dataset.section && String(m.meeting) === b.dataset.meeting));
  if (e.key === "Enter" || e.key === " ") {
    e.preventDefault();
    if (td.dataset.target) { move(Number(td.dataset.period), false); return; }
    if (!mtgs.length) { notice(S.picked ? "This cell is not a place " + meetingLabel(S.picked) + " can be moved to." : "This cell has no meeting to pick."); return; }
    const i = S.picked ? mtgs.findIndex((m) => m.index === S.picked.index) : -1;
    pick(mtgs[(i + 1) % mtgs.length], false);
    focusCell();
    return;
  }
  if (e.key === "l" || e.key === "L") {
    e.preventDefault();
    const m = S.picked || mtgs[0];
    if (m) lock(m, !m.locked);
    return;
  }
  if ((e.key === "w" || e.key === "W") && S.picked) { e.preventDefault(); whereElse(); }
}

// movesRoom says the pending move changes the room (a room chosen, or the
// week shown is another room's), so the meeting's own cell is a target too.
function movesRoom() {
  const chosen = $("room-choice").value, m = S.picked;
  return !!chosen || (S.subject && S.subject.kind === "room" && m && m.room !== S.subject.id);
}

function pick(m, focus) {
  S.picked = m;
  $("where").textContent = "";
  drawGrid();
  if (focus) { const b = document.querySelector(".here") || $("lock-toggle"); if (b) b.focus(); }
}
function unpick() { S.picked = null; $("room-choice").dataset.for = ""; $("where").textContent = ""; drawGrid(); }

function drawPicked() {
  const box = $("picked"), m = S.picked;
  box.hidden = !m;
  if (!m) return;
  $("picked-text").textContent = (m.locked ? "Chosen: " : "Moving ") + meetingLabel(m) + ", now " + whereText(m) + "." +
    (m.locked ? " It is locked: re-planning keeps it where it is, and it cannot be moved until it is unlocked." : isPattern(m) ? " It meets by a pattern: choose another of its patterns or rooms below, or press Esc." : " Choose a cell with “Move here”, or press Esc.");
  const lt = $("lock-toggle");
  lt.textContent = m.locked ? "Unlock this meeting" : "Lock this meeting here";
  lt.setAttribute("aria-pressed", m.locked ? "true" : "false");
  $("move-choices").hidden = !!m.locked;
  const pat = isPattern(m) ? S.term.patterns[m.section] : null;
  $("pattern-choice-box").hidden = !pat;
  $("pattern-move").hidden = !pat;
  $("room-choice-label").textContent = pat ? "Room" : "Room for the move";
  const sel = $("room-choice"), key = m.index + "/" + m.time + "/" + (S.subject ? S.subject.kind + ":" + S.subject.id : "");
  if (sel.dataset.for === key) return; // same meeting and week: keep the choices made
  sel.dataset.for = key;
  sel.textContent = "";
  sel.disabled = m.no_room;
  const keep = S.subject && S.subject.kind === "room" && !pat ? S.subject.id : m.room;
  sel.append(el("option", { value: "", text: m.no_room ? "no room (online or off-site)" : "keep " + (keep || "no room") }));
  const rooms = pat && pat.rooms.length ? pat.rooms.map((r) => ({ id: r.room, detail: r.weight ? "preference penalty " + r.weight : "fully acceptable" })) : S.term.rooms;
  if (!m.no_room) for (const r of rooms) if (r.id !== keep) sel.append(el("option", { value: r.id, text: r.id + " — " + r.detail }));
  if (pat) {
    const ps = $("pattern-choice");
    ps.textContent = "";
    for (const c of pat.times) ps.append(el("option", { value: String(c.time), text: c.text + (c.weight ? " (preference penalty " + c.weight + ")" : "") + (c.time === m.time ? " — now" : "") }));
    ps.value = String(m.time);
  }
}

async function lock(m, on) {
  try {
    S.state = await api("POST", "/api/lock", { version: S.state.version, section: m.section, meeting: m.meeting, locked: on });
    drawAll();
    notice((on ? "Locked " : "Unlocked ") + meetingLabel(m) + (on ? ": re-planning keeps it where it is." : "."));
  } catch (e) { notice(e.message, true); }
}

async function move(period, force, time, room) {
  const m = S.picked;
  if (!m) return;
  const body = { version: S.state.version, section: m.section, meeting: m.meeting, period, force };
  if (time) body.time = time;
  const chosen = room !== undefined ? room : $("room-choice").value;
  if (chosen) body.room = chosen;
  else if (S.subject && S.subject.kind === "room" && !m.no_room && !time) body.room = S.subject.id;
  try {
    const res = await api("POST", "/api/move", body);
    S.state = res.state;
    S.lastMove = { period, time, body };
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
  const forced = res.applied && !res.legal;
  v.append(el("p", {}, el("span", { class: "tag", text: res.legal ? "Allowed. " : forced ? "Placed anyway. " : "Not allowed. " }), res.what + (res.applied ? " — done." : " — not moved.")));
  if (res.reasons.length) {
    v.append(el("p", { text: "It " + (forced ? "breaks " : "would break ") + res.reasons.length + " hard requirement" + (res.reasons.length > 1 ? "s" : "") + (forced ? " (listed under Requirements and cost until fixed; “Re-plan the rest” can repair it):" : ":") }));
    v.append(el("ul", { class: "problems" }, ...res.reasons.map((r) => el("li", {}, el("strong", { text: r.rule + ": " }), r.msg))));
  }
  if (res.cost.length) {
    const t = el("table", {}, el("caption", { text: "Change in cost" }), el("tr", {}, el("th", { text: "Preference" }), el("th", { text: "Before" }), el("th", { text: "After" }), el("th", { text: "Change" })));
    for (const c of res.cost) t.append(el("tr", {}, el("td", { text: c.name }), el("td", { class: "num", text: c.before }), el("td", { class: "num", text: c.after }), el("td", { class: "num", text: (c.after - c.before > 0 ? "+" : "") + (c.after - c.before) })));
    v.append(t);
  } else v.append(el("p", { text: "No change in cost." }));
  if (res.levels && res.levels.length) v.append(el("p", { text: "Total cost by level (highest first): " + res.levels.map((l) => "level " + l.level + " " + l.before + " → " + l.after).join("; ") + "." }));
  if (!res.applied) {
    v.append(el("button", { type: "button", id: "force", onclick: () => move(period, true, S.lastMove && S.lastMove.time, S.lastMove && S.lastMove.body.room), text: "Place it anyway (breaks the requirements above)" }));
    v.append(" ", el("button", { type: "button", id: "ask-why", onclick: () => whyNot(period, S.lastMove && S.lastMove.time), text: "Why not, and where else could it go?" }));
    v.append(el("div", { id: "whynot", "aria-live": "polite" }));
  }
  if (res.applied) v.append(el("button", { type: "button", onclick: undo, text: "Undo this move" }));
}

// whyNot asks the explanation engine whether any timetable of the term
// can have the picked meeting's section at period (or at its meeting time
// time), and where else it could go.
async function whyNot(period, time) {
  const m = S.picked, out = $("whynot");
  if (!m || !out) return;
  out.textContent = "Searching every timetable of the term (this can take a few seconds)…";
  let q = "/api/whynot?section=" + encodeURIComponent(m.section) + (time ? "&time=" + time : "&period=" + period);
  const chosen = $("room-choice").value || (time && S.lastMove.body.room) || "";
  if (chosen) q += "&room=" + encodeURIComponent(chosen);
  try {
    const a = await api("GET", q);
    out.textContent = "";
    if (a.granted) {
      out.append(el("p", { text: "Some timetable of the term does have " + a.request + ": the clash is with this timetable's other meetings, which would have to move." }));
      if (!time) out.append(el("button", { type: "button", id: "whynot-replan", onclick: () => replan({ section: m.section, meeting: m.meeting, period }), text: "Lock it there and re-plan the rest" }));
      return;
    }
    out.append(el("p", {}, el("strong", { text: "No timetable of the term can have " + a.request + "." }), a.reasons.length ? " These requirements cannot all hold" + (a.minimal ? " (drop any one and the rest can):" : ":") : ""));
    if (a.reasons.length) out.append(el("ul", { class: "problems", id: "whynot-reasons" }, ...a.reasons.map((r) => el("li", {}, r.sentence + (r.where ? " (" + r.where + ")" : "")))));
    if (a.places.length) {
      out.append(el("p", { text: "It could go instead at" + (a.complete ? "" : " (not every time was tried)") + ":" }));
      out.append(el("ul", { id: "whynot-places" }, ...a.places.map((p) => el("li", {}, p.at + (p.room ? " in " + p.room : "") + " ",
        el("button", { type: "button", onclick: () => (p.time ? move(p.period, false, p.time, p.room || "") : move(p.period, false)), "aria-label": "Try moving " + meetingLabel(m) + " to " + p.at, text: "Try this" })))));
    } else out.append(el("p", { text: "No other time was found for it." }));
    if (a.uncertain) out.append(el("p", { text: "Note: " + a.uncertain }));
  } catch (e) { out.textContent = "Problem: " + e.message; }
}

// studentWhy asks whether a student can take every course they asked
// for without a clash on the version shown, and if not why (the same answer
// as explain TERM TIMETABLE --student ID).
async function studentWhy(id) {
  const out = $("student-out");
  if (!out) return;
  out.textContent = "Trying every choice of sections…";
  const line = (x) => x.section + " (" + x.when + (x.room ? " in " + x.room : "") + ")" + (x.sources && x.sources.length ? " [" + x.sources.join("; ") + "]" : "");
  try {
    const a = await api("GET", "/api/student?id=" + encodeURIComponent(id));
    out.textContent = "";
    const n = a.all_requests + " requested course" + (a.all_requests === 1 ? "" : "s");
    if (a.status === "fits") {
      out.append(el("p", {}, el("strong", { text: "Yes. " }), "Student " + a.student + " can get all " + n + " without a clash on this version (edit " + a.version + "), for example:"));
      out.append(el("ul", { id: "student-choice" }, ...(a.choice || []).map((x) => el("li", { text: line(x) }))));
      return;
    }
    if (a.status !== "clashes") { out.append(el("p", { text: "No answer: the requests have too many combinations of sections to try." })); return; }
    out.append(el("p", {}, el("strong", { text: "No. " }), "Student " + a.student + " cannot get all " + n + " without a clash on this version (edit " + a.version + ")" +
      (a.requests.length < a.all_requests ? ": already these " + a.requests.length + " cannot be combined" : "") + " (drop any one and the rest fit):"));
    out.append(el("ul", {}, ...a.requests.map((r) => el("li", { text: r.course + (r.alternatives && r.alternatives.length ? " (or instead " + r.alternatives.join(", ") + ")" : "") + ": " +
      (r.options.length ? r.options.map((o) => o.join(" + ")).join(", or ") : "no section of it is in the term") + (r.source ? " [" + r.source + "]" : "") }))));
    const why = [...(a.clashes || []).map((c) => line(c.a) + " and " + line(c.b) + ": " + c.why + "."),
      ...(a.full || []).map((f) => line(f.section) + " is full: " + f.held + " other student" + (f.held === 1 ? "" : "s") + ", its limit " + f.limit + ".")];
    if (why.length) {
      out.append(el("p", { text: "Every choice meets one of these:" }));
      out.append(el("ol", { class: "problems", id: "student-reasons" }, ...why.map((w) => el("li", { text: w }))));
    }
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
    const cells = [m.section, m.title, String(m.meeting), m.day + (m.weeks ? " (weeks " + m.weeks + ")" : ""), m.start + "–" + m.end, m.no_room ? "no room" : m.room, m.staff.map(staffName).join(", "), m.cohorts.join(", "), m.locked ? "locked" : ""];
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
      out.append(el("ul", {}, ...(a.sections || []).map((mv) => el("li", { text: mv.course + (mv.part ? " " + mv.part : "") + ": " + (mv.from && mv.to ? "section " + mv.from + " → " + mv.to : mv.to ? "now in section " + mv.to : "no longer in section " + mv.from) })),
        ...a.changes.map((ch) => el("li", { text: ch.section + (ch.title ? " " + ch.title : "") + ": " + ch.change + " — " + [ch.from, ch.to].filter(Boolean).join(" → ") }))));
    }
  } catch (e) { notice(e.message, true); }
}


// ---- searches that take seconds: re-plan and where else ----
// watch polls a job twice a second, calling show with it while it runs
// and done once it has finished.
function watch(job, show, done) {
  const tick = async () => {
    let j;
    try { j = await api("GET", "/api/job?id=" + job.id); } catch (e) { done(null, e); return; }
    if (j.state === "running") { show(j); setTimeout(tick, 500); } else done(j, null);
  };
  show(job);
  setTimeout(tick, 500);
}

function progressText(j) {
  const p = j.progress || {};
  let t = "Working (" + Math.round(j.elapsed_ms / 1000) + " s): " + (p.phase || "starting") + ".";
  if (p.cost && p.cost.length) t += " Best cost so far by level (highest first): " + p.cost.join(", ") + ".";
  if (p.found) t += " " + p.found + " better timetable" + (p.found > 1 ? "s" : "") + " found.";
  if (p.steps) t += " " + p.steps + " neighbourhood steps.";
  return t;
}

async function cancelJob(id) {
  try { await api("POST", "/api/job/cancel", { id }); } catch (e) { notice(e.message, true); }
}

// jobBox shows a running job's progress and its stop button in out. It
// builds them once per job and then only updates the text, so the focus
// stays on the button; the text is not announced at every tick
// (aria-live off), only the answer that replaces it.
function jobBox(out, j, stopText) {
  const p = out.querySelector(".progress");
  if (p && out.dataset.job === String(j.id)) { p.textContent = progressText(j); return; }
  out.textContent = "";
  out.dataset.job = String(j.id);
  out.append(el("p", { class: "progress", "aria-live": "off", text: progressText(j) }), el("button", { type: "button", class: "stop", onclick: () => cancelJob(j.id), text: stopText }));
}

async function whereElse() {
  const m = S.picked, out = $("where");
  if (!m) return;
  out.textContent = "Starting the search…";
  let job;
  try { job = await api("POST", "/api/whereelse", { section: m.section, meeting: m.meeting }); } catch (e) { out.textContent = "Problem: " + e.message; return; }
  watch(job, (j) => jobBox(out, j, "Stop searching"), (j, err) => {
    out.textContent = "";
    if (err) { out.textContent = "Problem: " + err.message; return; }
    if (j.state === "failed") { out.textContent = "Problem: " + j.error; return; }
    const a = j.result;
    out.append(el("h3", { id: "where-h", tabindex: "-1", text: "Where else " + a.section + " meeting " + a.meeting + " could go (now " + a.from + ")" }));
    out.append(el("p", { text: a.basis + "." + (a.complete ? " Every start was tried." : " The search stopped before every start was tried: the list may be short.") }));
    if (!a.places.length) { out.append(el("p", { text: "No other place was found." })); return; }
    const alone = a.places.filter((p) => p.alone).length;
    out.append(el("p", { text: a.places.length + " other place" + (a.places.length > 1 ? "s" : "") + ": " + alone + " where it can move alone, cheapest first, then " + (a.places.length - alone) + " where other meetings would have to move too." }));
    const rank = (p) => p.levels.reduce((acc, l) => acc * 1e6 + (l.after - l.before), 0);
    const sorted = [...a.places].sort((x, y) => (y.alone - x.alone) || (rank(x) - rank(y)) || (x.period - y.period) || (x.time - y.time));
    const tb = el("tbody");
    for (const p of sorted) {
      const change = levelDelta(p.levels);
      tb.append(el("tr", {}, el("th", { scope: "row", class: "nowrap", text: p.at }), el("td", { text: p.room || "no room" }),
        el("td", { text: p.alone ? "alone" : "with other moves" + (p.reason ? " (alone it breaks: " + p.reason.split(":")[0] + ")" : "") }),
        el("td", { text: p.alone ? change : "—" }),
        el("td", {}, p.alone
          ? el("button", { type: "button", onclick: () => move(p.period, false, p.time || undefined, p.room || ""), "aria-label": "Move " + meetingLabel(m) + " to " + p.at + (p.room ? " in " + p.room : ""), text: "Move here" })
          : el("button", { type: "button", onclick: () => replan({ section: m.section, meeting: m.meeting, period: p.period }), "aria-label": "Lock " + meetingLabel(m) + " at " + p.at + " and re-plan the rest", text: "Lock it there and re-plan" }))));
    }
    out.append(el("div", { class: "scroll places-wrap" }, el("table", { id: "where-list", class: "places" },
      el("thead", {}, el("tr", {}, ...["Place", "Room", "How", "Change in cost (moving it alone)", ""].map((h) => el("th", { scope: "col", text: h })))), tb)));
    if (document.activeElement === document.body) $("where-h").focus(); // the stop button that had the focus is gone
  });
}

// levelDelta is "+4 at level 1, −2 at level 0", or "no change".
function levelDelta(levels) {
  const parts = (levels || []).filter((l) => l.after !== l.before).map((l) => (l.after > l.before ? "+" : "−") + Math.abs(l.after - l.before) + " at level " + l.level);
  return parts.length ? parts.join(", ") : "no change";
}

async function replan(place) {
  const out = $("replan-out");
  const secs = Number($("replan-seconds").value) || 20;
  out.textContent = "Starting the re-plan…";
  $("replan").disabled = true;
  let job;
  const body = { version: S.state.version, seconds: secs };
  if (place) body.place = place;
  try { job = await api("POST", "/api/replan", body); } catch (e) { out.textContent = "Problem: " + e.message; $("replan").disabled = false; return; }
  if (place) $("replan-h").scrollIntoView();
  watch(job, (j) => jobBox(out, j, "Stop (keep the best so far)"), (j, err) => {
    $("replan").disabled = false;
    out.textContent = "";
    setTimeout(() => { if (document.activeElement === document.body) $("replan-h").focus(); }, 0); // the stop button that had the focus is gone
    if (err) { out.textContent = "Problem: " + err.message; return; }
    if (j.state === "failed") { out.textContent = "Problem: " + j.error; return; }
    const a = j.result;
    if (a.status !== "found") { out.append(el("p", { class: "tag", text: a.status === "none" ? "No timetable found with these locks." : "No timetable found in time." }), ...(a.notes || []).map((n) => el("p", { text: n }))); return; }
    out.append(el("p", {}, el("strong", { text: "A new timetable was found" + (j.stopped ? " (stopped early: the best so far)" : "") + ". " }),
      a.moves.length + " meeting" + (a.moves.length === 1 ? "" : "s") + " move; " + a.locked + " locked meeting" + (a.locked === 1 ? " stays" : "s stay") + " where " + (a.locked === 1 ? "it is" : "they are") + ". Checked: " + a.checked + "." + (a.proven ? " No timetable with these locks costs less." : "")));
    if (a.moves.length) out.append(el("ul", { id: "replan-moves" }, ...a.moves.map((mv) => el("li", { text: mv.section + ": " + [mv.from, mv.to].filter(Boolean).join(" → ") + (mv.change !== "moved" ? " (" + mv.change + ")" : "") }))));
    if (a.students && a.students.length) {
      out.append(el("p", { text: a.students.length + " change" + (a.students.length === 1 ? "" : "s") + " of section for students:" }));
      out.append(el("ul", { id: "replan-students" }, ...a.students.map((mv) => el("li", { text: mv.student + ", " + mv.course + (mv.part ? " " + mv.part : "") + ": " + (mv.from && mv.to ? mv.from + " → " + mv.to : mv.to ? "now in " + mv.to : "no longer in " + mv.from) }))));
    }
    if (a.cost.length) out.append(el("p", { text: "Change in cost: " + a.cost.map((c) => c.name + " " + c.before + " → " + c.after).join("; ") + "." }));
    else out.append(el("p", { text: "No change in cost." }));
    out.append(el("button", { type: "button", id: "replan-keep", onclick: () => decide(j.id, true), text: "Keep this timetable" }), " ",
      el("button", { type: "button", id: "replan-discard", onclick: () => decide(j.id, false), text: "Discard it" }));
    $("replan-keep").focus();
  });
}

async function decide(id, keep) {
  const out = $("replan-out");
  try {
    S.state = await api("POST", "/api/replan/decide", { version: S.state.version, job: id, keep });
    out.textContent = keep ? "Kept: the re-planned timetable is now edit " + S.state.version + " (Undo takes it back)." : "Discarded: the timetable is as it was.";
    drawAll();
    notice(keep ? "The re-planned timetable was kept." : "The re-planned timetable was discarded.");
  } catch (e) { out.textContent = "Problem: " + e.message; }
}

// ---- change notices ----
async function notices() {
  const out = $("notices-out");
  out.textContent = "";
  try {
    const n = await api("GET", "/api/notices?old=" + encodeURIComponent($("cmp-old").value) + "&new=" + encodeURIComponent($("cmp-new").value));
    out.append(el("h3", { id: "notices-h", text: "Change notices: " + n.old + " → " + n.new }));
    out.append(el("p", { text: n.notices.length ? n.notices.length + " staff members, cohorts and students are affected (rooms get no notice). Open one to copy its text or download its calendar." : "No one is affected." }));
    const kinds = { staff: "Staff", cohort: "Cohorts", student: "Students" };
    for (const kind of Object.keys(kinds)) {
      const list = n.notices.map((x, i) => ({ x, i })).filter(({ x }) => x.kind === kind);
      if (!list.length) continue;
      const group = el("section", { class: "notice-group", "aria-label": kinds[kind] + " affected" }, el("h4", { text: kinds[kind] + " (" + list.length + ")" }));
      for (const { x, i } of list) {
        const who = x.kind + " " + (x.name ? x.name + " (" + x.id + ")" : x.id);
        const ta = el("textarea", { id: "notice-" + i, readonly: true, rows: String(Math.min(18, x.text.split("\n").length + 1)), "aria-label": "Notice for " + who });
        ta.value = x.text;
        const status = el("span", { class: "copied", role: "status" });
        group.append(el("details", { class: "notice-item" }, el("summary", { text: who + " — " + x.changes + " change" + (x.changes > 1 ? "s" : "") }), ta,
          el("p", {}, el("button", { type: "button", class: "copy", onclick: () => copyText(ta, status), text: "Copy text" }), " ",
            el("a", { href: x.calendar, download: x.file, class: "download", text: "Download calendar " + x.file }), " ", status)));
      }
      out.append(group);
    }
  } catch (e) { out.append(el("p", { class: "tag", text: "Problem: " + e.message })); }
}

async function copyText(ta, status) {
  try { await navigator.clipboard.writeText(ta.value); status.textContent = "Copied."; }
  catch (e) { ta.focus(); ta.select(); status.textContent = "Selected: press Ctrl+C (or ⌘C) to copy."; }
}

document.addEventListener("DOMContentLoaded", () => {
  $("find").addEventListener("input", drawMatches);
  $("filter").addEventListener("input", drawMaster);
  $("undo").addEventListener("click", undo);
  $("save").addEventListener("click", save);
  $("cancel-pick").addEventListener("click", unpick);
  $("lock-toggle").addEventListener("click", () => { if (S.picked) lock(S.picked, !S.picked.locked); });
  $("where-else").addEventListener("click", whereElse);
  $("pattern-move").addEventListener("click", () => move(-1, false, Number($("pattern-choice").value), $("room-choice").value));
  $("replan").addEventListener("click", () => replan(null));
  $("replan-seconds").addEventListener("focus", (e) => e.target.select());
  $("notices").addEventListener("click", notices);
  $("room-choice").addEventListener("change", drawGrid);
  $("cmp-new").addEventListener("change", (e) => { e.target.dataset.touched = "1"; });
  $("compare-form").addEventListener("submit", compare);
  document.addEventListener("keydown", (e) => {
    if (e.key !== "Escape" || !S.picked) return;
    const inGrid = $("grid-wrap").contains(document.activeElement);
    unpick();
    if (inGrid) focusCell();
  });
  load();
});
