// Package dxf writes the DXF drawings of a build from its report model:
// the cut sheets (WriteSheetDXF), the panel type and member type drawings
// (WritePanelTypeDXF, WriteMemberTypeDXF) and the assembly plan
// (WriteAssemblyDXF). Files are AC1015 with millimetre units, text in code
// page 1252 with \U+XXXX escapes for the rest, and numbers to fixed
// digits, so the same report gives the same bytes.
package dxf
