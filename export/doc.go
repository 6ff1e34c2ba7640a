// Package export publishes a timetable: per-person PDF grids, a workbook,
// iCalendar files, CSV and JSON, written from a timetable.Term and a
// timetable.Schedule. It knows nothing of logic programs: it imports only
// timetable and file-format libraries.
//
// # What comes out
//
// Publish writes a whole directory (see its documentation for the layout);
// the single writers are WriteTimetableWorkbook, WriteTimetableCSV,
// WriteTimetableJSON, WritePersonPDF, WriteCombinedPDF, WriteICS,
// WriteClassListCSV and WriteStaffClassLists. A Subject names whose
// schedule to write: a staff member, room or cohort (timetable.WhoStaff,
// WhoRoom, WhoCohort) or a student (WhoStudent). A student's sections are
// their fixed enrolments (Term.Enrolments) and the timetable's sectioned
// ones (Schedule.Enrolments), together Term.StudentEnrolments.
//
// Weekly grid PDF (one landscape page, A4 or US Letter): a header with the
// person's, room's or cohort's name and details on the left and the term's
// name, dates, number of teaching weeks (weeks with at least one day of
// teaching: a week of holidays does not count) and the days without teaching
// as ranges ("25 Oct – 1 Nov, 8 Dec", runs joined over weekends; as many as
// fit, then "and n more") on the right; below it a grid with the days as
// columns and the term's distinct period times as rows, each row labelled
// with its start and end. A heavy rule marks a break between periods (such
// as lunch); a day without a period at that time is hatched; the subject's
// unavailable times from the Unavailable sheet are cross-hatched
// ("Unavailable: reason") or, for preferences, light grey ("Preferably free:
// reason"), with its weeks when it holds only in some weeks. Each meeting
// is one framed block over all the rows it occupies,
// with a dark bar on its left edge, holding the section (bold) and its
// times, then its weeks when it does not meet every week, the title
// (wrapped, cut with "…" only when there is no room), the room and building
// (or "online / off-site"; left out on that room's own page) and the staff
// names (wrapped between names; left out on the page of a section's only
// staff member). When a block has too few lines for all of it, the weeks
// move into the section's line in place of the times. A section meeting only
// in some weeks has a white block with a dashed frame and a lighter bar;
// sections in disjoint weeks that share the same periods are stacked in the
// shared area, and meetings that overlap only partly share the column side
// by side. The page uses one text size where possible, the largest at which
// every block shows all its text (not below 6.5 pt). Only greys and line
// styles carry meaning, so it prints in black and white. The footer gives
// the generation time in the term's time zone and "Page n of m"; room pages
// add a caution that the posted legal occupancy and local codes take
// precedence over the seat counts entered.
//
// Combined PDF: a cover page (term, counts, teaching weeks with their
// numbering explained when a week has no teaching, every day without
// teaching as ranges, contents with page numbers, and a caution about legal
// room occupancy, accessibility and workload rules),
// the master list of every meeting sorted by day, time and section (column
// headers on each page, a rule at each new day), then every staff member's,
// room's and cohort's grid page.
//
// Both embed the Go fonts (golang.org/x/image/font/gofont, regular and
// bold), which cover Latin with its accents, Greek and Cyrillic (the WGL4
// repertoire). A letter outside it is printed as the nearest letter the font
// has (its canonical decomposition without the marks the font lacks: "ọ́"
// prints as "ó"), and only then as '?'; nothing is dropped silently.
//
// Meeting patterns: a section placed by one of its meeting times
// (Placement.Time) meets once on each day of the chosen pattern; each of
// those days is a meeting of the grids, lists and calendars, with the
// pattern's start, end and weeks. When a timetable has such placements
// the grids cannot use the period times alone: their rows are the pieces
// between every clock time at which a period or a meeting starts or ends
// (pieces nothing covers are left out and show as a heavy rule, like a
// break between periods), drawn to scale on the PDF (a row's height is in
// proportion to its minutes, so a block is as tall as its meeting is long
// and starts at its clock time; a row too short for a label has none, the
// blocks give their own times), nothing is hatched as "no such period",
// and the days are those of the periods and of the meetings. A grid term
// (no pattern placement) is drawn exactly as before.
//
// Workbook: the master sheet timetable.TimetableSheet with exactly the
// columns timetable.TimetableColumns (Meeting as a number, Day "Tue", Start
// and End "10:00", Staff and Cohorts as comma-separated IDs, Weeks as on the
// Sections sheet, Staff names), one row per meeting sorted by day, start,
// section and meeting (a pattern placement is one row: Day holds all its
// days, "Mon Wed Fri", Weeks the chosen meeting time's weeks, and it sorts
// by its first day; with pattern placements the end time sorts before
// the section), frozen header and a real AutoFilter (the sheet's
// autoFilter element, not only the hidden name), so that
// timetable.ReadSchedule reads it back; then one grid
// sheet per staff member (named after the person), room ("Room R204") and
// cohort ("Cohort C1") with the same layout as the PDF (a merged cell per
// meeting; meetings sharing periods share one merged cell, each with its
// times; frozen day headers and time column); the Load sheet (per staff
// member: sections, meetings and distinct periods a week, busiest day,
// their limit, periods taught over the whole term date by date; per room:
// largest class, meetings, occupied grid periods, grid periods and
// utilisation = occupied / grid periods; and a caution; with pattern
// placements the same figures in hours, a room's utilisation being its
// busy hours over the grid rows' hours on every day); then
// Options.Extra. With sectioning (course requests in the term, or
// sectioned students in the timetable) two sheets come after Load: the
// class lists, timetable.ClassListSheet with timetable.ClassListColumns,
// one row per sectioned student and section sorted by section then
// student (fixed enrolments are term data and are not repeated), which
// ReadSchedule reads back into Schedule.Enrolments; and the sectioning
// report, SectioningSheet (SectioningColumns): the requests not met with
// the sectioner's reason, the full and nearly full sections (from 90% of
// their limit), and each student's pairs of sections that meet at the
// same time, each with its term row; Options.Findings replaces the
// report computed from the timetable (solve passes the sectioner's own,
// which also knows clashes by travel time). A term without requests gets
// neither sheet, so its workbook is what it was. Sheet names go through
// SheetNames (Excel's limits). Every
// sheet prints landscape on Options.Paper, one page wide, with its header
// row (grids: day headers and time column) repeated on each page.
//
// Class lists for staff: one workbook per staff member teaching a section
// with students (WriteStaffClassLists; a workbook rather than CSV so that
// each section prints as its own titled roster and IDs stay text): the
// sheet ClassListsSheet with every student of their sections, then a
// sheet per section headed by its course and part, meetings and head
// count against its limit. Fixed and sectioned students are both listed,
// the Enrolment column saying which.
//
// CSV: the master sheet's columns and cells exactly (CSVColumns), RFC 4180
// with CRLF, except that a cell a spreadsheet would take for a formula
// (beginning with = + - @ tab or carriage return, OWASP "CSV Injection")
// gets a single quote in front (timetable.SafeCSVCell; the readers take it
// off). WriteClassListCSV writes the class lists the same way, with
// timetable.ClassListColumns. Workbook cells are typed strings and never
// formulas. JSON:
// TimetableJSON, whose field names are stable.
//
// # Calendars (RFC 5545)
//
// One VCALENDAR per subject, one VEVENT per meeting. DTSTART and DTEND are
// local times with TZID set to the term's IANA time zone, and the calendar
// carries a VTIMEZONE for it generated from Go's zone data (embedded with
// time/tzdata, so it does not depend on the machine): every offset change
// from 1 January of the first day's year to the end of the last day's year
// is one STANDARD or DAYLIGHT observance with its exact onset and no RRULE,
// so the file stays right across daylight-saving changes in the term and
// whatever the zone's rules were in other years. DAYLIGHT is chosen by the
// offset going up (this keeps Europe/Dublin, whose data calls winter time
// the exception, in the usual form). DTSTART is the first date, on or
// after the term's first day, on which the meeting takes place;
// RRULE:FREQ=WEEKLY;UNTIL= gives its last date (UNTIL in UTC, as §3.3.10
// requires with a TZID start); EXDATE lists, in between, the holidays and
// the weeks outside the section's Weeks. A meeting that never takes place
// has no event. SUMMARY is "section title", LOCATION "room, building",
// DESCRIPTION section and meeting number, title, staff names, cohorts and
// weeks. UID is a hash of term name, section, meeting number and subject,
// so publishing again (even with the meeting moved) updates the event
// instead of adding one; SEQUENCE is the number of seconds from 2020 to
// Options.Generated, so a later publication always wins (two in the same
// second share it); DTSTAMP is
// Options.Generated. A pattern placement is one such event per day of
// its pattern, each from its own first date, with the pattern's weeks (a
// block course in weeks 3-6 starts in week 3 and ends in week 6; alternate
// weeks list the weeks in between as EXDATE); the first day's UID is the
// one a grid meeting of that number has, the others add the day's place in
// the pattern ("1.2", "1.3"), so a placement moved to other days keeps
// updating its events, and a change notice's calendar cancels the events
// of the days a pattern no longer meets. Lines end in CRLF and are folded at 75 octets, never
// inside a UTF-8 sequence (§3.1); TEXT values are escaped (§3.3.11). A
// calendar file that was imported (rather than subscribed to) keeps events
// that a later publication no longer has; people must delete those by hand.
//
// # Names and safety
//
// File names come from SafeFileNames (no path traversal, no reserved
// characters or Windows device names, unique ignoring case); manifest.json
// maps them back to IDs. Publish writes into a temporary directory next to
// the target and renames it into place; it never replaces a directory that
// holds anything but an earlier publication.
//
// # Representation
//
// Every writer first resolves the schedule into a view: meetings with their
// section, first and last period (or chosen meeting time and day), times,
// weeks, room and grid rows, sorted by start period, section and meeting
// (with pattern placements: by day, start, end, section, meeting and day
// of the pattern), plus per-subject lists of meeting indexes and the grid
// (days, distinct period times or pieces of the day, which day has which
// period). A
// subject's meetings on one day whose rows overlap form a cluster; boxes
// place a cluster's members (stacked when they cover the same rows, side by
// side otherwise). A view is read-only once its calendar data is made, so
// Publish shares one view between its workers (one per CPU).
package export
