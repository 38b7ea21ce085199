package main

// Writing files and standard output. cairn never writes over a file it
// read (the goals file, the actuals file it names), never replaces a file
// unless --force is given, leaves no partial or temporary file behind (not
// even when interrupted), gives a new file the mode the user's umask asks
// for, keeps an existing file's mode under --force, and works on file
// systems without chmod or hard links.

import (
	"errors"
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"os/signal"
	"path/filepath"
	"syscall"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

// Hooks a test replaces to act like a file system without hard links or
// chmod, or to interrupt a write; link, chmod and exit are the real calls.
var (
	link             = os.Link
	chmod            = (*os.File).Chmod
	exit             = os.Exit
	testOnlyMidWrite func(tmp string)
)

// goalsFile returns the goals file a command reads: its argument, or
// cairn.yaml when none is given; "" for standard input.
func goalsFile(c *cli.Context) string {
	switch name := c.Args().First(); name {
	case "-":
		return ""
	case "":
		return "cairn.yaml"
	default:
		return name
	}
}

// An input is a file a command read, which it never writes over: the
// goals file, or the actuals file it names.
type input struct{ what, name string }

// writeFileAtomic writes data to name through a temporary file in the same
// directory moved into place, so a failure leaves no partial file. It refuses
// to replace an existing file unless force is set, to replace what is not a
// regular file (a link that leads nowhere among them), and to write over any
// of inputs under any name.
func writeFileAtomic(name string, data []byte, force bool, inputs ...input) error {
	st, err := os.Stat(name)
	for _, in := range inputs {
		if err != nil || in.name == "" {
			continue
		}
		if ist, ierr := os.Stat(in.name); ierr == nil && os.SameFile(st, ist) {
			return &inputError{err: fmt.Errorf("%s is the %s %s; cairn never writes over a file it reads", name, in.what, in.name),
				hint: "name another file for the output"}
		}
	}
	exists := err == nil
	if _, lerr := os.Lstat(name); lerr == nil {
		exists = true
	} else if !errors.Is(lerr, os.ErrNotExist) {
		return &inputError{err: fmt.Errorf("cannot write %s: %v", name, unwrapPath(lerr))}
	}
	if exists && !force {
		return errExists(name)
	}
	if exists && err != nil { // a link to nowhere, or a loop of links
		return &inputError{err: fmt.Errorf("cannot write %s: it is a link that does not lead to a file (%v)", name, unwrapPath(err)),
			hint: "remove the link, or name another file"}
	}
	if exists && !st.Mode().IsRegular() {
		return &inputError{err: fmt.Errorf("cannot write %s: not a regular file", name)}
	}
	f, tmp, err := createTemp(filepath.Dir(name), "."+filepath.Base(name)+".tmp-")
	if err != nil {
		return &inputError{err: fmt.Errorf("cannot write %s: %v", name, unwrapPath(err))}
	}
	stop := removeOnSignal(tmp)
	defer stop()
	_, werr := f.Write(data)
	if testOnlyMidWrite != nil {
		testOnlyMidWrite(tmp)
	}
	if werr == nil && exists {
		_ = chmod(f, st.Mode().Perm()) // keep the file's mode; a file system without chmod keeps its own
	}
	if cerr := f.Close(); werr == nil {
		werr = cerr
	}
	if werr == nil {
		if exists {
			werr = os.Rename(tmp, name)
		} else {
			werr = linkNew(tmp, name, data)
		}
	}
	os.Remove(tmp) // after a link or a failure; after a rename it is gone already
	if werr != nil {
		if errors.Is(werr, os.ErrExist) && !force {
			return errExists(name)
		}
		return &inputError{err: fmt.Errorf("cannot write %s: %v", name, unwrapPath(werr))}
	}
	return nil
}

func errExists(name string) error {
	return &inputError{err: fmt.Errorf("%s already exists; not overwriting it", name), hint: "use --force to replace it, or name another file"}
}

// createTemp creates a new file with a random name in dir, with the mode a
// new file gets (0666 less the umask), unlike os.CreateTemp's 0600.
func createTemp(dir, prefix string) (*os.File, string, error) {
	for try := 0; ; try++ {
		name := filepath.Join(dir, fmt.Sprintf("%s%08x", prefix, rand.Uint32()))
		f, err := os.OpenFile(name, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o666)
		if err == nil || !errors.Is(err, os.ErrExist) || try == 100 {
			return f, name, err
		}
	}
}

// linkNew puts tmp in place as name, which must not exist: a hard link
// fails if name appeared meanwhile, where a rename would replace it. On a
// file system without hard links it creates name exclusively and writes
// data into it, removing it again if that fails.
func linkNew(tmp, name string, data []byte) error {
	err := link(tmp, name)
	if err == nil || errors.Is(err, os.ErrExist) || errors.Is(err, os.ErrNotExist) {
		return err
	}
	f, err := os.OpenFile(name, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o666)
	if err != nil {
		return err
	}
	_, err = f.Write(data)
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		os.Remove(name)
	}
	return err
}

// removeOnSignal removes tmp and exits if cairn is interrupted (SIGINT,
// SIGTERM) before the returned stop is called.
func removeOnSignal(tmp string) (stop func()) {
	sig := make(chan os.Signal, 1)
	done := make(chan struct{})
	signal.Notify(sig, os.Interrupt, syscall.SIGTERM)
	go func() {
		select {
		case s := <-sig:
			os.Remove(tmp)
			code := 130 // 128 + SIGINT, as shells report it
			if s == syscall.SIGTERM {
				code = 143
			}
			exit(code)
		case <-done:
		}
	}()
	return func() {
		signal.Stop(sig)
		close(done)
	}
}

func unwrapPath(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	var le *os.LinkError
	if errors.As(err, &le) {
		return le.Err
	}
	return err
}

// An outWriter is standard output that remembers its first write error, so
// that a command whose output was lost (a full disk, a closed pipe) exits 2
// with a message instead of 0.
type outWriter struct {
	w   io.Writer
	err error
}

func (o *outWriter) Write(p []byte) (int, error) {
	if o.err != nil {
		return 0, o.err
	}
	n, err := o.w.Write(p)
	if err != nil {
		o.err = err
	}
	return n, err
}

// writeStdout writes a file's bytes to standard output, with the note on
// standard error so the output stays the file.
func writeStdout(e *env, data []byte) error {
	if _, err := e.stdout.Write(data); err != nil {
		return outputError(err)
	}
	fmt.Fprint(e.stderr, render.Wrap("Note: "+noteText, 80))
	return nil
}

func outputError(err error) error {
	return &inputError{err: fmt.Errorf("cannot write standard output: %v", unwrapPath(err))}
}

// lostOutput turns a command's result into a write error when its standard
// output could not be written: the answer never reached the user.
func lostOutput(err error, out *outWriter) error {
	var na *noAnswer
	if out.err != nil && (err == nil || errors.As(err, &na)) {
		return outputError(out.err)
	}
	return err
}

// An inputFault is why a file cannot be read as one of cairn's inputs (a
// goals file, an actuals file).
type inputFault int

const (
	inputOK       inputFault = iota
	inputDir                 // a directory
	inputSpecial             // a device, pipe or socket
	inputTooLarge            // over plan.MaxFileSize bytes
)

// checkInput checks the file at path — or f, once it is open — as an input
// of at most plan.MaxFileSize bytes, before it is read: a directory, a
// device such as /dev/zero, a pipe that might never be written (opening it
// would wait), a huge sparse file. It returns the fault and the file's
// size; a file that cannot be looked at is left for opening to report.
func checkInput(path string, f *os.File) (inputFault, int64) {
	st, err := os.Stat(path)
	if f != nil {
		st, err = f.Stat()
	}
	switch {
	case err != nil:
		return inputOK, 0
	case st.IsDir():
		return inputDir, 0
	case !st.Mode().IsRegular():
		return inputSpecial, 0
	case st.Size() > plan.MaxFileSize:
		return inputTooLarge, st.Size()
	}
	return inputOK, st.Size()
}

// checkGoalsFile refuses a goals file that checkInput refuses, before
// reading it, and again on the opened file f.
func checkGoalsFile(name string, f *os.File) error {
	switch fault, size := checkInput(name, f); fault {
	case inputDir:
		return fmt.Errorf("%s is a directory, not a goals file", name)
	case inputSpecial:
		return fmt.Errorf("%s is not a regular file (a device, pipe or socket), not a goals file; to read standard input, give -", name)
	case inputTooLarge:
		return plan.ErrorList{{Pos: plan.Position{File: name}, Msg: fmt.Sprintf("file is %d bytes, over the %d-byte limit for a goals file", size, plan.MaxFileSize)}}
	}
	return nil
}
