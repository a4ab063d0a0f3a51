package export

import (
	"io"
	"os"
	"path/filepath"
	"runtime"
	"sync"

	"pqfab/export/dxf"
	"pqfab/export/pdf"
	"pqfab/export/web"
	"pqfab/export/xlsx"
	"pqfab/internal/outdir"
	"pqfab/internal/report"
	"pqfab/quadnet"
)

// Progress is told how many output files are done of how many.
type Progress func(done, total int, what string)

// WriteBuild writes every output of a build into dir, atomically and only
// where opt allows (see outdir.WriteFolder): all from the report, except
// net-flat.obj, the planarized net with the build's warnings (the
// result's, before the report adds its own) in its header. The files are written side by
// side, as many at a time as there are processors. It holds nothing else
// of the build, so the rest can be freed while it writes.
func WriteBuild(dir string, opt outdir.Options, net *quadnet.Net, warnings []string, rep *report.Report, progress Progress) error {
	return outdir.WriteFolder(dir, opt, func(tmp string) error {
		for _, d := range []string{report.DirSheets, report.DirSite, report.DirPanelTypes, report.DirMemberTypes} {
			if err := os.Mkdir(filepath.Join(tmp, d), 0o755); err != nil {
				return err
			}
		}
		total := 0 // the files: set once the list of jobs is made
		var mu sync.Mutex
		done := 0
		step := func(what string) {
			mu.Lock()
			defer mu.Unlock()
			done++
			if progress != nil {
				progress(done, total, what)
			}
		}
		file := func(name string, write func(w io.Writer) error) func() error {
			return func() error {
				if err := outdir.FillFile(filepath.Join(tmp, name), write); err != nil {
					return err
				}
				step(name)
				return nil
			}
		}
		// Every file is a job; the largest first. Workers, as many as
		// there are processors, take them in order; each file's bytes
		// depend only on the report, never on which worker wrote it.
		jobs := []func() error{
			file(report.FileAssembly, func(w io.Writer) error { return dxf.WriteAssemblyDXF(w, rep) }),
			file(report.FileSchedule, func(w io.Writer) error { return xlsx.WriteSchedule(w, rep) }),
			file(report.FileReport, func(w io.Writer) error { return report.WriteJSON(w, rep) }),
			file(report.FileHTML, func(w io.Writer) error { return web.WriteHTML(w, rep) }),
			file(report.FileView, func(w io.Writer) error { return web.WriteView(w, rep) }),
			file(report.FilePlanPDF, func(w io.Writer) error { return pdf.WritePlanPDF(w, rep) }),
			file(report.FileTagsPDF, func(w io.Writer) error { return pdf.WriteTagsPDF(w, rep) }),
			file(report.FileNet, func(w io.Writer) error { return WriteOBJ(w, net, "pqfab planarized net: "+rep.Title, warnings...) }),
		}
		for i := range rep.Sheets {
			name := filepath.Join(report.DirSheets, SheetFile(i, len(rep.Sheets)))
			jobs = append(jobs, file(name, func(w io.Writer) error { return dxf.WriteSheetDXF(w, rep, i) }))
		}
		for i, t := range rep.PanelTypes {
			jobs = append(jobs, file(filepath.Join(report.DirPanelTypes, t.Name+".dxf"), func(w io.Writer) error { return dxf.WritePanelTypeDXF(w, rep, i) }))
		}
		for i, t := range rep.MemberTypes {
			jobs = append(jobs, file(filepath.Join(report.DirMemberTypes, t.Name+".dxf"), func(w io.Writer) error { return dxf.WriteMemberTypeDXF(w, rep, i) }))
		}
		total = len(jobs)
		errs := make([]error, len(jobs))
		next := make(chan int)
		var wg sync.WaitGroup
		for range max(1, runtime.GOMAXPROCS(0)) {
			wg.Add(1)
			go func() {
				defer wg.Done()
				for i := range next {
					errs[i] = jobs[i]()
				}
			}()
		}
		for i := range jobs {
			next <- i
		}
		close(next)
		wg.Wait()
		for _, err := range errs {
			if err != nil {
				return err // the first; the others are usually the same cause
			}
		}
		return nil
	})
}
