//go:build !linux

package atomicfile

import "errors"

// exchange is not available here: ReplaceDir falls back to two renames.
func exchange(a, b string) error { return errors.ErrUnsupported }
