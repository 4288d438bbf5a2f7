package workbook

import (
	"bytes"
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"testing"
	"time"

	"rebound/cmd/rebound/internal/testrun"
	"rebound/cmd/rebound/internal/view"
)

// TestOpensInLibreOffice converts the demo workbook to PDF with
// LibreOffice Calc, headless, to check that real spreadsheet software opens
// it. It skips when LibreOffice is not installed (as in CI). With
// REBOUND_KEEP=dir set, the workbook and the PDF are kept there for
// looking at the pages (pdftoppm -png -r 60 rebound.pdf page).
func TestOpensInLibreOffice(t *testing.T) {
	soffice, err := exec.LookPath("soffice")
	if err != nil {
		if soffice, err = exec.LookPath("libreoffice"); err != nil {
			t.Skip("LibreOffice (soffice) is not installed; skipping the check that it opens the workbook")
		}
	}
	r, man := testrun.Demo(t)
	// A shallow copy with the first 300 events keeps the conversion quick
	// (the demo's full events table prints to some 200 pages).
	small := *r
	if r.Events != nil && len(r.Events.Events) > 300 {
		ev := *r.Events
		ev.Events = ev.Events[:300]
		small.Events = &ev
	}
	data, err := render(&small, man, view.Of(r))
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	if keep := os.Getenv("REBOUND_KEEP"); keep != "" {
		dir = keep
	}
	xlsx := filepath.Join(dir, "rebound.xlsx")
	if err := os.WriteFile(xlsx, data, 0o644); err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, soffice, "--headless", "--norestore", "-env:UserInstallation=file://"+filepath.Join(t.TempDir(), "profile"),
		"--convert-to", "pdf", "--outdir", dir, xlsx)
	var out bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &out
	if err := cmd.Run(); err != nil {
		t.Fatalf("soffice: %v\n%s", err, out.String())
	}
	pdf, err := os.ReadFile(filepath.Join(dir, "rebound.pdf"))
	if err != nil {
		t.Fatalf("no PDF: %v\n%s", err, out.String())
	}
	if !bytes.HasPrefix(pdf, []byte("%PDF-")) || len(regexp.MustCompile(`/Type\s*/Page[^s]`).FindAll(pdf, -1)) < 3 {
		t.Errorf("the PDF (%d bytes) does not look like a multi-page document", len(pdf))
	}
}
