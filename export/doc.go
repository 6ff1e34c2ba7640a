// Package export publishes a timetable: per-person PDF grids, a workbook,
// iCalendar files, CSV and JSON.
package export
