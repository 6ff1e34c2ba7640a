package benchfmt

import (
	"bufio"
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"strconv"
)

// walk reads the XML document r element by element for ReadXML and
// ReadXMLSolution, which share its error handling. A leading UTF-8
// byte-order mark is skipped. For each start element it sets x.line, pushes
// the name on x.stack and calls start with the parent's name ("" for the
// document); for each end element it calls end (when not nil) before
// popping. Malformed XML, text outside any attribute and maxErrors problems
// are reported into x.errs; repair is what the malformed-XML message tells
// the user to do. walk returns false when the read stopped early (start
// returned false, the XML is malformed or too many problems were found);
// the caller then returns x.errs.err().
func (x *xmlReader) walk(r io.Reader, repair string, start func(parent string, t xml.StartElement) bool, end func(name string)) bool {
	br := bufio.NewReader(r)
	if b, err := br.Peek(3); err == nil && bytes.Equal(b, []byte{0xEF, 0xBB, 0xBF}) {
		_, _ = br.Discard(3)
	}
	x.d = xml.NewDecoder(br)
	x.d.Strict = true
	for {
		tok, err := x.d.Token()
		if err == io.EOF {
			return true
		}
		if err != nil {
			line, _ := x.d.InputPos()
			var se *xml.SyntaxError
			msg := err.Error()
			if errors.As(err, &se) {
				line, msg = se.Line, se.Msg
			}
			x.errs.add(line, "the file is not well-formed XML ("+clip(msg)+"); "+repair)
			return false
		}
		switch t := tok.(type) {
		case xml.StartElement:
			x.line, _ = x.d.InputPos()
			parent := ""
			if len(x.stack) > 0 {
				parent = x.stack[len(x.stack)-1]
			}
			x.stack = append(x.stack, t.Name.Local)
			if !start(parent, t) {
				return false
			}
		case xml.EndElement:
			if end != nil {
				end(t.Name.Local)
			}
			x.stack = x.stack[:len(x.stack)-1]
		case xml.CharData:
			if text := bytes.TrimSpace(t); len(text) > 0 {
				line, _ := x.d.InputPos()
				x.errs.add(line, "text "+strconv.Quote(clip(string(text)))+" stands outside any attribute; remove it")
			}
		}
		if len(x.errs.list) >= maxErrors {
			return false
		}
	}
}
