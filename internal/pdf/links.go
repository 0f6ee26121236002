package pdf

// Bookmark adds an outline entry for a heading at y on the current page;
// level 0 is the top. The outline mirrors the pack's headings.
func (d *Doc) Bookmark(title string, level int, y float64) {
	if level < 0 {
		level = 0
	}
	d.f.Bookmark(Printable(title), level, y)
}

// NewLink reserves an internal link target; place it with SetLink.
func (d *Doc) NewLink() int { return d.f.AddLink() }

// SetLink points a link at y on a page (page 0 or less: the current page).
func (d *Doc) SetLink(id int, y float64, page int) {
	if page <= 0 {
		page = d.f.PageNo()
	}
	d.f.SetLink(id, y, page)
}

// LinkArea makes a rectangle of the current page jump to an internal link.
func (d *Doc) LinkArea(x, y, w, h float64, id int) { d.f.Link(x, y, w, h, id) }

// LinkURL makes a rectangle open an external address.
func (d *Doc) LinkURL(x, y, w, h float64, url string) { d.f.LinkString(x, y, w, h, url) }
