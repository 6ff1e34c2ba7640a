package encode

import "github.com/termwright/termwright/timetable"

// RequestsOf reads the rows of a requests sheet (timetable.ReadRequests)
// as requests, each At cell by ParseWhen. An At that cannot be read is an
// error at its cell (Requests!B3) and its row is left out; the problems
// are sorted, and the requests are nil when there is one.
func RequestsOf(rows []timetable.RequestRow) ([]Request, timetable.Problems) {
	var ps timetable.Problems
	out := make([]Request, 0, len(rows))
	for _, row := range rows {
		req, err := NewRequest(row.Section, row.At, row.Room)
		if err != nil {
			ps = append(ps, timetable.Problem{Pos: row.AtPos, Severity: timetable.Error, Msg: "At: " + err.Error()})
			continue
		}
		req.Src = row.Src
		out = append(out, req)
	}
	if len(ps) > 0 {
		ps.Sort()
		return nil, ps
	}
	return out, nil
}
