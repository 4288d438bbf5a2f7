package report

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// WriteFile writes the output of fill to path atomically: into a temporary
// file in the same folder, then synced, closed and renamed over path.
func WriteFile(path string, fill func(w io.Writer) error) error {
	tmp, err := writeTemp(path, fill)
	if err != nil {
		return err
	}
	if err := os.Rename(tmp, path); err != nil {
		os.Remove(tmp)
		return err
	}
	return nil
}

// File is one file of a set written by WriteFiles.
type File struct {
	Path string
	Data []byte
}

// WriteFiles writes a set of files in two steps: each into a temporary
// file beside it (written, synced and closed), then, when every one has
// been written, each renamed over its path. A failure in the first step
// (a full disk, a folder that cannot be made) removes the temporary files
// and leaves every path as it was, so a run never leaves a mix of new and
// old outputs behind for that reason.
func WriteFiles(files []File) error {
	tmps := make([]string, 0, len(files))
	cleanup := func() {
		for _, t := range tmps {
			os.Remove(t)
		}
	}
	for _, f := range files {
		data := f.Data
		tmp, err := writeTemp(f.Path, func(w io.Writer) error { _, err := w.Write(data); return err })
		if err != nil {
			cleanup()
			return err
		}
		tmps = append(tmps, tmp)
	}
	for i, f := range files {
		if err := os.Rename(tmps[i], f.Path); err != nil {
			tmps = tmps[i:]
			cleanup()
			return err
		}
	}
	return nil
}

// writeTemp writes the output of fill into a new temporary file in path's
// folder (made when missing) and returns its name; on failure nothing is
// left behind.
func writeTemp(path string, fill func(w io.Writer) error) (name string, err error) {
	dir := filepath.Dir(path)
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return "", err
	}
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return "", err
	}
	defer func() {
		if err != nil {
			f.Close()
			os.Remove(f.Name())
		}
	}()
	bw := bufio.NewWriter(f)
	if err := fill(bw); err != nil {
		return "", fmt.Errorf("%s: %w", path, err)
	}
	err = errors.Join(bw.Flush(), f.Sync(), f.Chmod(0o644))
	if err != nil {
		return "", err
	}
	if err = f.Close(); err != nil {
		return "", err
	}
	return f.Name(), nil
}
