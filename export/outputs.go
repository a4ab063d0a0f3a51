package export

import (
	"io"
	"os"
	"path/filepath"
)

// Output file names inside the build folder.
const (
	FileSchedule = "schedule.xlsx"
	FileAssembly = "assembly-plan.dxf"
	FileNet      = "net-flat.obj"
	FileReport   = "report.json"
	FileHTML     = "report.html"
	DirSheets    = "sheets"
)

// Progress is told how many output steps are done of how many.
type Progress func(done, total int, what string)

// WriteBuild writes every output of a build into dir, atomically.
func WriteBuild(dir string, b *Bundle, rep *Report, progress Progress) error {
	return WriteFolder(dir, func(tmp string) error {
		total := 5 + len(rep.Sheets)
		done := 0
		step := func(what string) {
			done++
			if progress != nil {
				progress(done, total, what)
			}
		}
		if err := writeFile(filepath.Join(tmp, FileReport), func(w io.Writer) error { return WriteJSON(w, rep) }); err != nil {
			return err
		}
		step(FileReport)
		if err := writeFile(filepath.Join(tmp, FileNet), func(w io.Writer) error {
			return WriteOBJ(w, b.Net, "pqfab planarized net: "+b.Title)
		}); err != nil {
			return err
		}
		step(FileNet)
		if err := writeFile(filepath.Join(tmp, FileSchedule), func(w io.Writer) error { return WriteSchedule(w, rep) }); err != nil {
			return err
		}
		step(FileSchedule)
		if err := writeFile(filepath.Join(tmp, FileAssembly), func(w io.Writer) error { return WriteAssemblyDXF(w, rep) }); err != nil {
			return err
		}
		step(FileAssembly)
		if err := writeFile(filepath.Join(tmp, FileHTML), func(w io.Writer) error { return WriteHTML(w, rep) }); err != nil {
			return err
		}
		step(FileHTML)
		sheets := filepath.Join(tmp, DirSheets)
		if err := os.Mkdir(sheets, 0o755); err != nil {
			return err
		}
		for i := range rep.Sheets {
			if err := writeFile(filepath.Join(sheets, SheetFile(i, len(rep.Sheets))), func(w io.Writer) error { return WriteSheetDXF(w, rep, i) }); err != nil {
				return err
			}
			step(SheetFile(i, len(rep.Sheets)))
		}
		return nil
	})
}
