// Package pdf writes the site team's printed set from the report model:
// the assembly plan book (WritePlanPDF: an index page and one page per
// bay) and the part tags with QR codes (WriteTagsPDF, on the sheet sizes
// of TagSizes). Text is written in code page 1252; the files carry no
// creation time, so the same report gives the same bytes.
package pdf
