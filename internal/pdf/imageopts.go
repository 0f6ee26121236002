package pdf

import "codeberg.org/go-pdf/fpdf"

func imageOptions(format string) fpdf.ImageOptions {
	t := "png"
	if format == "jpeg" {
		t = "jpg"
	}
	return fpdf.ImageOptions{ImageType: t, AllowNegativePosition: true}
}
