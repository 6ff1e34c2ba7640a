package main

import (
	"bytes"
	"io"
)

// writeBytesAtomic writes data through a temporary file beside path and
// renames it into place (see writeFileAtomic), with mode 0644.
func writeBytesAtomic(path string, data []byte) error {
	return writeFileAtomic(path, func(w io.Writer) error {
		_, err := io.Copy(w, bytes.NewReader(data))
		return err
	})
}
