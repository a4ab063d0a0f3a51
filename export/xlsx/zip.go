package xlsx

import (
	"archive/zip"
	"io"
	"sort"
)

// writeSortedZip copies a zip archive to w with its entries in a fixed
// order ([Content_Types].xml first, then by name) and no timestamps, so
// that the same content always gives the same bytes. excelize writes
// streamed sheets in map order, which varies from run to run. Entries are
// copied as they are compressed (no second compression).
func writeSortedZip(w io.Writer, archive io.ReaderAt, size int64) error {
	zr, err := zip.NewReader(archive, size)
	if err != nil {
		return err
	}
	files := append([]*zip.File(nil), zr.File...)
	sort.SliceStable(files, func(i, j int) bool {
		a, b := files[i].Name, files[j].Name
		if (a == "[Content_Types].xml") != (b == "[Content_Types].xml") {
			return a == "[Content_Types].xml"
		}
		return a < b
	})
	zw := zip.NewWriter(w)
	for _, f := range files {
		hdr := &zip.FileHeader{Name: f.Name, Method: f.Method, CRC32: f.CRC32,
			CompressedSize64: f.CompressedSize64, UncompressedSize64: f.UncompressedSize64}
		dst, err := zw.CreateRaw(hdr)
		if err != nil {
			return err
		}
		src, err := f.OpenRaw()
		if err != nil {
			return err
		}
		if _, err := io.Copy(dst, src); err != nil {
			return err
		}
	}
	return zw.Close()
}
