package demo

import (
	"bytes"
	"image"
	"image/color"
	"image/png"
)

// logoPNG draws the logo of the client-report template's invented client
// university: a deep teal square with three rising bars. It is drawn in
// code, so no image file is copied from anywhere.
func logoPNG() []byte {
	const size = 240
	img := image.NewNRGBA(image.Rect(0, 0, size, size))
	teal := color.NRGBA{R: 0x0f, G: 0x5e, B: 0x6b, A: 0xff}
	light := color.NRGBA{R: 0xe8, G: 0xf1, B: 0xf2, A: 0xff}
	amber := color.NRGBA{R: 0xe0, G: 0x9f, B: 0x3e, A: 0xff}
	for y := 0; y < size; y++ {
		for x := 0; x < size; x++ {
			img.SetNRGBA(x, y, teal)
		}
	}
	bar := func(x0, x1, top int, c color.NRGBA) {
		for y := top; y < 200; y++ {
			for x := x0; x < x1; x++ {
				img.SetNRGBA(x, y, c)
			}
		}
	}
	bar(40, 80, 130, light)
	bar(100, 140, 90, light)
	bar(160, 200, 40, amber)
	var buf bytes.Buffer
	// Encoding an in-memory image cannot fail.
	_ = (&png.Encoder{CompressionLevel: png.BestCompression}).Encode(&buf, img)
	return buf.Bytes()
}
