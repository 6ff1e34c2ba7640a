package main

import (
	"bytes"
	"io"
)

// writeBytesAtomic writes data through a temporary file beside path and
// renames it into place (writeOutput with force: it replaces only a
// regular file), with mode 0644.
func writeBytesAtomic(path string, data []byte) error {
	_, err := writeOutput(path, true, func(w io.Writer) error {
		_, err := io.Copy(w, bytes.NewReader(data))
		return err
	})
	return err
}
