package pdf

import (
	"bytes"
	"compress/zlib"
	"encoding/binary"
	"hash/crc32"
	"image"
	"image/color"
	"image/gif"
	"runtime"
	"strings"
	"testing"
)

// pngChunk writes one PNG chunk: length, type, data, CRC-32 over type and
// data (PNG specification, W3C/ISO 15948, section 5.3).
func pngChunk(buf *bytes.Buffer, typ string, data []byte) {
	binary.Write(buf, binary.BigEndian, uint32(len(data)))
	buf.WriteString(typ)
	buf.Write(data)
	crc := crc32.NewIEEE()
	crc.Write([]byte(typ))
	crc.Write(data)
	binary.Write(buf, binary.BigEndian, crc.Sum32())
}

// bombPNG is a valid PNG header claiming w x h 8-bit grey pixels whose
// image data, all zeros, deflates to a few kilobytes: decoding it would
// allocate w x h bytes.
func bombPNG(w, h uint32, rows int) []byte {
	var buf bytes.Buffer
	buf.WriteString("\x89PNG\r\n\x1a\n")
	ihdr := make([]byte, 13)
	binary.BigEndian.PutUint32(ihdr[0:], w)
	binary.BigEndian.PutUint32(ihdr[4:], h)
	ihdr[8], ihdr[9] = 8, 0 // bit depth 8, greyscale
	pngChunk(&buf, "IHDR", ihdr)
	var z bytes.Buffer
	zw := zlib.NewWriter(&z)
	row := make([]byte, 1+w)
	for i := 0; i < rows; i++ {
		zw.Write(row)
	}
	zw.Close()
	pngChunk(&buf, "IDAT", z.Bytes())
	pngChunk(&buf, "IEND", nil)
	return buf.Bytes()
}

// A decompression bomb (a small file claiming 60,000 x 60,000 pixels,
// 3.6 GB once decoded) is refused from its header, before any decoding:
// the heap does not grow by anything near the image's size.
func TestDecompressionBombRefused(t *testing.T) {
	bomb := bombPNG(60000, 60000, 64)
	if len(bomb) > 1<<20 {
		t.Fatalf("the test bomb is %d bytes; it should be small", len(bomb))
	}
	d := New(Options{})
	var before, after runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&before)
	_, err := d.RegisterImage("logo.png", bomb)
	runtime.ReadMemStats(&after)
	if err == nil || !strings.Contains(err.Error(), "60000 x 60000 pixels") {
		t.Fatalf("want the bomb refused by its size, got %v", err)
	}
	if grew := int64(after.TotalAlloc - before.TotalAlloc); grew > 64<<20 {
		t.Errorf("refusing the bomb allocated %d bytes; it must not decode it", grew)
	}
}

func TestOnlyPNGAndJPEG(t *testing.T) {
	var buf bytes.Buffer
	img := image.NewPaletted(image.Rect(0, 0, 4, 4), color.Palette{color.Black, color.White})
	gif.Encode(&buf, img, nil)
	d := New(Options{})
	_, err := d.RegisterImage("logo.gif", buf.Bytes())
	if err == nil || !strings.Contains(err.Error(), "PNG") {
		t.Fatalf("a GIF must be refused naming the accepted formats, got %v", err)
	}
	if _, err := d.RegisterImage("logo.png", bombPNG(16, 16, 16)); err != nil {
		t.Errorf("a small valid PNG must be accepted: %v", err)
	}
}
