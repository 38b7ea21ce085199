//go:build unix

package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"cairn/examples"
)

// runIn runs cairn in dir and returns its exit code and standard error.
func runIn(t *testing.T, dir string, stdout *bytes.Buffer, args ...string) (int, string) {
	t.Helper()
	wd, _ := os.Getwd()
	if err := os.Chdir(dir); err != nil {
		t.Fatal(err)
	}
	defer os.Chdir(wd)
	var stderr bytes.Buffer
	if stdout == nil {
		stdout = new(bytes.Buffer)
	}
	code := run(append([]string{"cairn"}, args...), strings.NewReader(""), stdout, &stderr, fixedNow)
	return code, stderr.String()
}

func noTemp(t *testing.T, dir string) {
	t.Helper()
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		if strings.Contains(e.Name(), ".tmp-") {
			t.Errorf("temporary file %s left in %s", e.Name(), dir)
		}
	}
}

// A hard link to the goals file is the goals file (issue 13 item 7).
func TestReport_RefusesHardLinkToInput(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "mine.yaml")
	if err := os.WriteFile(in, examples.Household, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Link(in, filepath.Join(dir, "other.html")); err != nil {
		t.Skip("no hard links here:", err)
	}
	code, stderr := runIn(t, dir, nil, "report", "mine.yaml", "--out", "other.html", "--force")
	if code != 2 || !strings.Contains(stderr, "other.html is the goals file mine.yaml") {
		t.Errorf("report onto a hard link of its input: exit %d, stderr:\n%s", code, stderr)
	}
	if got, _ := os.ReadFile(in); !bytes.Equal(got, examples.Household) {
		t.Error("the goals file was changed")
	}
}

// New files follow the umask; --force keeps an existing file's mode (issue
// 13 item 10). 0666 less the umask is what open(2) gives a new file (POSIX).
func TestInit_FileModes(t *testing.T) {
	old := syscall.Umask(0o027)
	defer syscall.Umask(old)
	dir := t.TempDir()
	if code, stderr := runIn(t, dir, nil, "init", "new.yaml"); code != 0 {
		t.Fatalf("init: exit %d\n%s", code, stderr)
	}
	if st, _ := os.Stat(filepath.Join(dir, "new.yaml")); st.Mode().Perm() != 0o640 {
		t.Errorf("new file mode %v, want 0640 (0666 under umask 027)", st.Mode().Perm())
	}
	kept := filepath.Join(dir, "kept.yaml")
	if err := os.WriteFile(kept, []byte("x"), 0o600); err != nil {
		t.Fatal(err)
	}
	os.Chmod(kept, 0o604)
	if code, stderr := runIn(t, dir, nil, "init", "kept.yaml", "--force"); code != 0 {
		t.Fatalf("init --force: exit %d\n%s", code, stderr)
	}
	if st, _ := os.Stat(kept); st.Mode().Perm() != 0o604 {
		t.Errorf("--force changed the mode to %v, want 0604 kept", st.Mode().Perm())
	}
	noTemp(t, dir)
}

// Writing works where chmod and hard links fail, as on a FAT file system
// (issue 13 item 10).
func TestInit_WithoutLinkOrChmod(t *testing.T) {
	defer func(l func(string, string) error, c func(*os.File, os.FileMode) error) { link, chmod = l, c }(link, chmod)
	link = func(string, string) error { return syscall.EPERM }
	chmod = func(*os.File, os.FileMode) error { return syscall.EPERM }
	dir := t.TempDir()
	for _, args := range [][]string{{"init", "a.yaml"}, {"init", "a.yaml", "--force"}} {
		if code, stderr := runIn(t, dir, nil, args...); code != 0 {
			t.Fatalf("%q: exit %d\n%s", args, code, stderr)
		}
		if got, _ := os.ReadFile(filepath.Join(dir, "a.yaml")); !bytes.Equal(got, examples.Household) {
			t.Errorf("%q wrote %d bytes, want the example", args, len(got))
		}
	}
	if code, stderr := runIn(t, dir, nil, "init", "a.yaml"); code != 2 || !strings.Contains(stderr, "already exists") {
		t.Errorf("init over an existing file without links: exit %d\n%s", code, stderr)
	}
	noTemp(t, dir)
}

// An interrupted write leaves no temporary file (issue 13 item 10).
func TestWrite_InterruptLeavesNoTemp(t *testing.T) {
	for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM} {
		dir := t.TempDir()
		exited := make(chan int, 1)
		exit = func(code int) { exited <- code }
		testOnlyMidWrite = func(tmp string) {
			syscall.Kill(os.Getpid(), sig)
			select {
			case code := <-exited:
				if want := 128 + int(sig); code != want {
					t.Errorf("%v: exit %d, want %d", sig, code, want)
				}
			case <-time.After(5 * time.Second):
				t.Errorf("%v: not handled", sig)
			}
		}
		runIn(t, dir, nil, "init", "a.yaml")
		exit, testOnlyMidWrite = os.Exit, nil
		noTemp(t, dir)
		if _, err := os.Stat(filepath.Join(dir, "a.yaml")); err == nil {
			t.Errorf("%v: a.yaml written after the interrupt", sig)
		}
	}
}

type failWriter struct{}

func (failWriter) Write([]byte) (int, error) { return 0, syscall.ENOSPC }

// A failed write to standard output exits 2 with a message (issue 13 item
// 14), as `cairn help file > /dev/full` does.
func TestRun_StdoutWriteFails(t *testing.T) {
	hh := filepath.Join(t.TempDir(), "household.yaml")
	os.WriteFile(hh, examples.Household, 0o644)
	for _, args := range [][]string{{"help", "file"}, {"status", hh}, {"init", "-"}, {"--help"}} {
		var stderr bytes.Buffer
		code := run(append([]string{"cairn"}, args...), strings.NewReader(""), failWriter{}, &stderr, fixedNow)
		if code != 2 || !strings.HasPrefix(stderr.String(), "cairn: error: ") || !strings.Contains(stderr.String(), "no space left on device") {
			t.Errorf("%q to a full disk: exit %d, stderr:\n%s", args, code, stderr.String())
		}
	}
}

// A pipe as the goals file is refused, not opened and waited on (issue 13
// item 14).
func TestRun_FIFOGoalsFile(t *testing.T) {
	dir := t.TempDir()
	if err := syscall.Mkfifo(filepath.Join(dir, "pipe.yaml"), 0o600); err != nil {
		t.Skip("no FIFOs here:", err)
	}
	done := make(chan struct{})
	var code int
	var stderr string
	go func() { code, stderr = runIn(t, dir, nil, "check", "pipe.yaml"); close(done) }()
	select {
	case <-done:
	case <-time.After(5 * time.Second):
		t.Fatal("check on a FIFO hangs")
	}
	if code != 2 || !strings.Contains(stderr, "pipe.yaml is not a regular file") {
		t.Errorf("check on a FIFO: exit %d\n%s", code, stderr)
	}
}
