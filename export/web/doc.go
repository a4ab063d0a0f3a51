// Package web writes the pages a browser opens: report.html (WriteHTML,
// the summary with charts and sheet previews) and view.html (WriteView,
// the 3D view with search, working without WebGL too). The JavaScript
// libraries are vendored in assets with their licence; text is escaped
// for HTML and for the script blocks it lands in.
package web
