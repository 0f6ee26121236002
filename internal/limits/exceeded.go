package limits

import (
	"fmt"

	"peerpack/internal/diag"
)

// Over returns the end of a message about a count or size over a limit:
// what was found, the limit, and how to raise it. advice (optional) is the
// first remedy to offer before raising the limit. Example:
//
//	250,000 institutions, over the limit of 200,000; raise it with --limit institutions=250000
func (l Limits) Over(name Name, found int64, advice string) string {
	return l.over(name, found, false, advice)
}

// Beyond is Over for a reader that stops at the limit and so does not know
// the full count:
//
//	more than the limit of 10,000,000 rows; split the file, or raise the limit with --limit rows=20M
func (l Limits) Beyond(name Name, advice string) string {
	return l.over(name, l.Get(name)+1, true, advice)
}

func (l Limits) over(name Name, found int64, stopped bool, advice string) string {
	s, ok := lookup(name)
	if !ok {
		return fmt.Sprintf("%s, over a limit", Group(found))
	}
	lim := *s.field(&l)
	var what, suggest string
	switch {
	case stopped:
		what = fmt.Sprintf("more than the limit of %s %s", Group(lim), s.unit)
		suggest = compact(2*lim, 1000, "")
	case s.bytes:
		what = fmt.Sprintf("%s bytes (%s), over the limit of %s", Group(found), human(found), compact(lim, 1024, " iB"))
		if found < 1024 {
			what = fmt.Sprintf("%s bytes, over the limit of %s", Group(found), compact(lim, 1024, " iB"))
		}
		suggest = compact(roundUp(found), 1024, "")
	default:
		what = fmt.Sprintf("%s %s, over the limit of %s", Group(found), s.unit, Group(lim))
		suggest = fmt.Sprint(found)
	}
	if advice != "" {
		return fmt.Sprintf("%s; %s, or raise the limit with --limit %s=%s", what, advice, s.name, suggest)
	}
	return fmt.Sprintf("%s; raise it with --limit %s=%s", what, s.name, suggest)
}

// roundUp rounds a byte size up to a whole number of the largest binary
// unit below it, plus one, so the suggested limit admits it.
func roundUp(n int64) int64 {
	for _, u := range []int64{1 << 30, 1 << 20, 1 << 10} {
		if n >= u {
			return (n/u + 1) * u
		}
	}
	return n
}

// compact writes n with a K, M or G suffix when it is a whole multiple
// (base 1000 for counts, 1024 for sizes; tail "iB" for sizes in prose),
// else in plain digits, so that it can be typed back after --limit.
func compact(n int64, base int64, tail string) string {
	for _, u := range []struct {
		suffix string
		size   int64
	}{{"G", base * base * base}, {"M", base * base}, {"K", base}} {
		if n >= u.size && n%u.size == 0 {
			if tail != "" {
				return fmt.Sprintf("%d %s%s", n/u.size, u.suffix, tail[1:])
			}
			return fmt.Sprintf("%d%s", n/u.size, u.suffix)
		}
	}
	if tail != "" {
		return fmt.Sprintf("%s bytes", Group(n))
	}
	return fmt.Sprint(n)
}

// Exceeded reports whether found is over the limit name.
func (l Limits) Exceeded(name Name, found int64) bool {
	s, ok := lookup(name)
	return ok && found > *s.field(&l)
}

// Check returns a positioned problem when found is over the limit name,
// else nil. subject starts the message ("the brief defines"), advice is the
// first remedy (optional). Build calls it for the groups and charts of a
// brief:
//
//	lim.Check(b.File, line, col, limits.Groups, int64(len(m.Groups)), "the brief defines", "narrow each: or drop groups")
func (l Limits) Check(file string, line, col int, name Name, found int64, subject, advice string) error {
	if !l.Exceeded(name, found) {
		return nil
	}
	return diag.At(file, line, col, "%s %s", subject, l.Over(name, found, advice))
}

// human writes a byte size to one decimal in the largest binary unit it
// reaches ("1.5 MiB").
func human(n int64) string {
	for _, u := range []struct {
		name string
		size int64
	}{{"GiB", 1 << 30}, {"MiB", 1 << 20}, {"KiB", 1 << 10}} {
		if n >= u.size {
			return fmt.Sprintf("%.1f %s", float64(n)/float64(u.size), u.name)
		}
	}
	return fmt.Sprintf("%d bytes", n)
}
