// Package export writes a build's output folder from its report model
// (package report), whole or not at all (WriteBuild), and the planarized
// net as OBJ (WriteOBJ). Each format family has its own package: dxf (cut
// sheets, type drawings, assembly plan), pdf (plan book and tags), xlsx
// (the schedule) and web (report.html, view.html); report.json is the
// model itself (report.WriteJSON). What the families share (the site
// model, label placement, text rules) is in export/internal/layout. No
// writer computes geometry beyond what drawing needs. Lengths are
// millimetres and angles degrees in every file; numbers have fixed
// precision so the same input gives the same bytes.
package export
