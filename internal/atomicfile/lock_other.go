//go:build !unix

package atomicfile

import "os"

// lockFile has no system lock here: the folder is not protected.
func lockFile(*os.File) error { return nil }
