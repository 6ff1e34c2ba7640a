package web

import (
	"net/http"
)

func (s *Server) handleWhyNot(w http.ResponseWriter, r *http.Request) {
	writeError(w, http.StatusNotImplemented, "not yet")
}
