package web

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"net/http"
)

// maxBody caps request bodies: an edit is a few hundred bytes.
const maxBody = 64 << 10

// apiError is the body of every refused request.
type apiError struct {
	Error string `json:"error"`
	// Version is the current version, on a stale edit.
	Version int `json:"version,omitempty"`
}

func writeJSON(w http.ResponseWriter, code int, v any) {
	w.Header().Set("Content-Type", "application/json; charset=utf-8")
	w.WriteHeader(code)
	enc := json.NewEncoder(w)
	enc.SetIndent("", " ")
	_ = enc.Encode(v)
}

func writeError(w http.ResponseWriter, code int, msg string) {
	writeJSON(w, code, apiError{Error: msg})
}

// readBody decodes one JSON object into v, refusing unknown fields,
// trailing data and bodies over maxBody, with a sentence that says what
// to send instead.
func readBody(w http.ResponseWriter, r *http.Request, v any) error {
	dec := json.NewDecoder(http.MaxBytesReader(w, r.Body, maxBody))
	dec.DisallowUnknownFields()
	if err := dec.Decode(v); err != nil {
		var mbe *http.MaxBytesError
		if errors.As(err, &mbe) {
			return fmt.Errorf("the request body is over %d bytes; send one edit at a time", maxBody)
		}
		if errors.Is(err, io.EOF) {
			return errors.New("the request body is empty; send a JSON object")
		}
		return fmt.Errorf("the request body is not the JSON this call takes (%v); see the page's own requests for the fields", err)
	}
	if dec.More() {
		return errors.New("the request body holds more than one JSON value; send exactly one object")
	}
	return nil
}
