//go:build unix

package atomicfile

import (
	"io/fs"
	"os"
	"syscall"
)

// writable reports whether the real user may write path (access(2)).
func writable(path string) bool { return syscall.Access(path, 2 /* W_OK */) == nil }

// keepOwner gives f the owner and group of the file it replaces; only
// root may, so a failure is ignored.
func keepOwner(f *os.File, fi fs.FileInfo) {
	if st, ok := fi.Sys().(*syscall.Stat_t); ok && os.Geteuid() == 0 {
		_ = f.Chown(int(st.Uid), int(st.Gid))
	}
}
