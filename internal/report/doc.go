// Package report is the model every output file is written from: New
// fills it straight from a build's result (pipeline.Result), with every
// number rounded to the digits the files print (LenDigits, AngleDigits,
// …), parts named by their labels, and the cost estimate worked out from
// the job's rates. report.json is the model as JSON (WriteJSON); the
// writers in export/dxf, export/pdf, export/xlsx and export/web read only
// the model, never the result. The package also names the build folder's
// files (FileReport, …) and prints a build's headline numbers (WriteText).
//
// Lengths are millimetres, angles degrees, areas m², weights kg.
package report
