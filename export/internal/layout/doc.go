// Package layout is what the drawings, the printed set and the pages
// share: the site model (Site: nodes by label, the bays that hold parts),
// label placement without overlaps (Placer, Box), the hub and numbering
// notes, bevel sign texts, and the text rules every format starts from
// (OneLine, WarningLines, WrapWords). Text from the job or the net
// (titles, names, ids, warnings) reaches several file formats; each format
// package applies its own escaping on top.
package layout
