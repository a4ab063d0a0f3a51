// Package job reads a build job file (TOML): its schema, the defaults, and
// where each key stands in the file, so that every problem names the file,
// the line and the key. It turns the job into the libraries' option
// structs and checks them with their own Validate methods, mapping each
// bad field back to the key the user wrote; only the job's own settings
// (net file and unit, supports, bay size, stock names, rates, text) are
// checked here. A job's 0 means 0 where the libraries read a zero field as
// its default: the Explicit functions turn it into the library's constant
// for 0, or report it where the library has none.
//
// Units are those of the keys' names: millimetres (…_mm), degrees (…_deg),
// kilograms per cubic metre, and money per unit for rates.
package job
