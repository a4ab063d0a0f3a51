// Package export writes what pqfab computed: OBJ nets, and later DXF cut
// sheets, XLSX schedules, JSON and HTML reports, into an output folder
// written atomically. It computes no geometry. Lengths are millimetres
// and angles degrees in every file; numbers have fixed precision so the
// same input gives the same bytes.
package export
