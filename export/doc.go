// Package export writes the report model (package report) into an output
// folder written atomically (WriteBuild): DXF cut sheets, panel and
// member type drawings and the assembly plan, the XLSX schedule, JSON and
// HTML reports, the site set (plan.pdf, tags.pdf, view.html) and the
// planarized net as OBJ. It computes no geometry beyond what drawing
// needs. Lengths are millimetres and angles degrees in every file; numbers
// have fixed precision so the same input gives the same bytes.
package export
