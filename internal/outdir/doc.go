// Package outdir writes pqfab's outputs so that nothing is lost: an
// output folder or file is replaced whole or not at all, and only when
// pqfab wrote it (README, "What pqfab will not overwrite").
//
// A folder (WriteFolder) is filled under a temporary name beside it,
// ".DIR.pqfab-tmp-ID", marked as pqfab's from its first moment; the marker
// file (MarkerFile) is written last and the folder then takes DIR's place
// by two renames, the previous folder waiting as ".DIR.pqfab-old-ID" in
// between. An existing DIR is replaced only when it is empty or holds the
// marker, or with Options.Force.
//
// A single file (WriteFileAtomic: planarize -o and --report, sample -o,
// DIR-planarity.json) is written to a temporary sibling and renamed into
// place; an existing file is replaced only when it carries pqfab's
// signature in its first kilobytes, or with Force.
//
// Never, not even with Force: a file listed in Options.Keep (the job and
// net files), a folder holding one, the current folder or one above it,
// the home folder or one above it, the root.
//
// Two builds into one folder cannot run at once: a lock ".DIR.pqfab-lock"
// beside it, an advisory flock the system releases however the process
// ends. Leftovers: a run killed outright leaves its temporary folder, and
// the next run removes it and, if the kill came between the two renames,
// first puts the previous folder back (see WriteFolder). TempFolder lets a
// signal handler remove the temporary folder of a run it stops.
//
// CheckFolder and CheckFiles make the same checks before any work, so a
// build that could not write its output stops at once.
//
// The package is Unix-only (flock) and never prints, exits or reads the
// clock.
package outdir
