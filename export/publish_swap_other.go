//go:build !linux

package export

import "errors"

// exchange is not available here: the caller falls back to two renames.
func exchange(a, b string) error { return errors.ErrUnsupported }
