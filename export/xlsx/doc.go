// Package xlsx writes the schedule (WriteSchedule): one XLSX workbook with
// a sheet per kind of part, type, stock and the cost estimate, numbers as
// numbers, and a glossary. Text reaching a cell is checked against what
// the format can carry; the archive's entries are written in a fixed
// order, so the same report gives the same bytes.
package xlsx
