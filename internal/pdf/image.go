package pdf

import (
	"bytes"
	"fmt"
	"image"
	"image/draw"
	_ "image/jpeg" // decode configs of JPEG logos
	"image/png"
)

// Limits on a user's image, checked from its header before anything is
// decoded, so a small file claiming a gigapixel cannot exhaust memory.
const (
	MaxImageSide   = 8000
	MaxImagePixels = 40_000_000
	MaxImageBytes  = 16 << 20
)

// ImageInfo is a checked image ready to place.
type ImageInfo struct {
	name          string
	kind          string
	Width, Height int // pixels
}

// RegisterImage checks a PNG or JPEG and adds it to the document. what
// names the image in messages (its path in the brief).
func (d *Doc) RegisterImage(what string, data []byte) (*ImageInfo, error) {
	if len(data) > MaxImageBytes {
		return nil, fmt.Errorf("%s is %d bytes, over the limit of %d; use a smaller PNG or JPEG", what, len(data), MaxImageBytes)
	}
	cfg, format, err := image.DecodeConfig(bytes.NewReader(data))
	if err != nil {
		return nil, fmt.Errorf("%s is not a PNG or JPEG image that can be read (%v); save it as PNG or JPEG", what, err)
	}
	if format != "png" && format != "jpeg" {
		return nil, fmt.Errorf("%s is a %s image; only PNG and JPEG are accepted", what, format)
	}
	if cfg.Width <= 0 || cfg.Height <= 0 || cfg.Width > MaxImageSide || cfg.Height > MaxImageSide || cfg.Width*cfg.Height > MaxImagePixels {
		return nil, fmt.Errorf("%s is %d x %d pixels; images may be at most %d pixels a side and %d pixels in all; scale it down", what, cfg.Width, cfg.Height, MaxImageSide, MaxImagePixels)
	}
	if format == "png" {
		// fpdf refuses interlaced and 16-bit PNGs; decoding (now known to be
		// of bounded size) and re-encoding gives it the plain 8-bit form.
		img, _, err := image.Decode(bytes.NewReader(data))
		if err != nil {
			return nil, fmt.Errorf("%s could not be decoded (%v); re-save it as PNG or JPEG", what, err)
		}
		nrgba := image.NewNRGBA(img.Bounds())
		draw.Draw(nrgba, nrgba.Bounds(), img, img.Bounds().Min, draw.Src)
		var buf bytes.Buffer
		if err := png.Encode(&buf, nrgba); err != nil {
			return nil, fmt.Errorf("%s could not be re-encoded: %v", what, err)
		}
		data = buf.Bytes()
	}
	d.images++
	info := &ImageInfo{name: fmt.Sprintf("img%03d", d.images), kind: format, Width: cfg.Width, Height: cfg.Height}
	opts := imageOptions(format)
	d.f.RegisterImageOptionsReader(info.name, opts, bytes.NewReader(data))
	if err := d.f.Error(); err != nil {
		return nil, fmt.Errorf("%s could not be embedded: %v; re-save it as a plain 8-bit PNG or baseline JPEG", what, err)
	}
	return info, nil
}

// DrawImage places a registered image in a rectangle (mm).
func (d *Doc) DrawImage(info *ImageInfo, x, y, w, h float64) {
	d.f.ImageOptions(info.name, x, y, w, h, false, imageOptions(info.kind), 0, "")
}
