package brief

import (
	"fmt"
	"sort"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"peerpack/internal/diag"
)

// PeersSpec asks for data-driven peer groups: institutions clustered by
// their profiles over Indicators (the front matter's peers: section).
type PeersSpec struct {
	Indicators []string `yaml:"indicators"`
	// Weights multiply an indicator's standardised values (default 1):
	// a value judgement the pack states.
	Weights map[string]float64 `yaml:"weights"`
	// Year defaults to the brief's year.
	Year int `yaml:"year"`
	// K is a number of clusters, or auto (average silhouette over 2..12).
	K KChoice `yaml:"k"`
	// Method is kmeans (default) or ward.
	Method string `yaml:"method"`
	// Restarts of k-means, each from its own k-means++ seeding (default 25).
	Restarts int `yaml:"restarts"`
	// Seed fixes every random choice (default 1).
	Seed *int64 `yaml:"seed"`
	// Standardise is sd (default: mean 0 and sample SD 1 over the
	// population) or none (raw values).
	Standardise string `yaml:"standardise"`
	// Resamples is the number of bootstrap resamples for stability
	// (default 20; 0 leaves stability out).
	Resamples *int `yaml:"resamples"`
	// Nearest is how many nearest-profile peers of the focus to list
	// (default 5).
	Nearest int `yaml:"nearest"`
}

// KChoice is a fixed number of clusters or auto (N = 0).
type KChoice struct {
	N   int
	Set bool
}

// Auto reports whether k is chosen from the data.
func (k KChoice) Auto() bool { return k.N == 0 }

// UnmarshalYAML accepts a whole number or auto.
func (k *KChoice) UnmarshalYAML(n *yaml.Node) error {
	k.Set = true
	if n.Kind == yaml.ScalarNode {
		if n.Value == "auto" {
			return nil
		}
		if v, err := strconv.Atoi(n.Value); err == nil {
			k.N = v
			return nil
		}
	}
	return fmt.Errorf("line %d column %d: k must be a number of clusters (2 or more) or auto", n.Line, n.Column)
}

// ClusterRef names a cluster of the peers: section for a group: the
// focus's own (cluster: focus, the form that carries over to any focus)
// or a cluster number (cluster: 2).
type ClusterRef struct {
	Focus bool
	N     int
}

// UnmarshalYAML accepts focus or a cluster number.
func (c *ClusterRef) UnmarshalYAML(n *yaml.Node) error {
	if n.Kind == yaml.ScalarNode {
		if n.Value == "focus" {
			c.Focus = true
			return nil
		}
		if v, err := strconv.Atoi(n.Value); err == nil && v >= 1 {
			c.N = v
			return nil
		}
	}
	return fmt.Errorf("line %d column %d: cluster must be focus (the focus's own cluster) or a cluster number from 1, e.g. cluster: focus", n.Line, n.Column)
}

// Defaults of the peers: section.
const (
	DefaultPeerRestarts  = 25
	DefaultPeerResamples = 20
	DefaultPeerNearest   = 5
	DefaultPeerSeed      = 1
	// MaxPeerK bounds a fixed k; auto tries 2..12.
	MaxPeerK = 30
)

// SeedValue is the seed, or the default.
func (p *PeersSpec) SeedValue() uint64 {
	if p.Seed == nil {
		return DefaultPeerSeed
	}
	return uint64(*p.Seed)
}

// ResampleCount is the number of resamples, or the default.
func (p *PeersSpec) ResampleCount() int {
	if p.Resamples == nil {
		return DefaultPeerResamples
	}
	return *p.Resamples
}

// Fingerprint identifies the clustering a spec asks for, so a batch that
// builds many packs over one dataset clusters once.
func (p *PeersSpec) Fingerprint(year int) string {
	ws := make([]string, 0, len(p.Weights))
	for k, v := range p.Weights {
		ws = append(ws, k+"="+strconv.FormatFloat(v, 'g', -1, 64))
	}
	sort.Strings(ws)
	return fmt.Sprintf("%s|%s|%d|%d|%s|%d|%d|%s|%d", strings.Join(p.Indicators, ","), strings.Join(ws, ","), year, p.K.N, p.Method, p.Restarts, p.SeedValue(), p.Standardise, p.ResampleCount())
}

// validatePeers checks the peers: section and fills its defaults.
func (b *Brief) validatePeers(l *diag.List) {
	p := b.Peers
	at := func(key string) Pos { return b.PosOf("peers." + key) }
	bad := func(key, format string, args ...any) {
		pos := at(key)
		if _, ok := b.Lines["peers."+key]; !ok {
			pos = b.PosOf("peers")
		}
		l.Addf(b.File, pos.Line, pos.Column, format, args...)
	}
	if p == nil {
		for _, g := range b.Groups {
			if g.Cluster != nil {
				l.Addf(b.File, g.Pos.Line, g.Pos.Column, "group %q: cluster groups come from the peers: section, which this brief does not have; add one, e.g. peers: {indicators: [citation_impact, papers_per_academic], k: auto}", g.Name)
			}
		}
		return
	}
	if len(p.Indicators) < 2 {
		bad("indicators", "peers: needs indicators, at least two, to compare profiles on, e.g. indicators: [citation_impact, papers_per_academic, intl_staff_share]")
	}
	seen := map[string]bool{}
	for _, k := range p.Indicators {
		if seen[k] {
			bad("indicators", "peers: indicator %q is listed twice", k)
		}
		seen[k] = true
	}
	keys := make([]string, 0, len(p.Weights))
	for k := range p.Weights {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		if !seen[k] {
			bad("weights", "peers: weight for %q, which is not one of the peers indicators; weights apply to listed indicators only", k)
		}
		if w := p.Weights[k]; !(w > 0) || w > 100 {
			bad("weights", "peers: weight %v for %q; weights must be above 0 and at most 100", w, k)
		}
	}
	if p.K.Set && p.K.N != 0 && (p.K.N < 2 || p.K.N > MaxPeerK) {
		bad("k", "peers: k = %d; use a number from 2 to %d, or auto", p.K.N, MaxPeerK)
	}
	switch p.Method {
	case "":
		p.Method = "kmeans"
	case "kmeans", "ward":
	default:
		bad("method", "peers: method %q is not known; use kmeans (default) or ward", p.Method)
	}
	switch {
	case p.Restarts == 0:
		p.Restarts = DefaultPeerRestarts
	case p.Restarts < 1 || p.Restarts > 1000:
		bad("restarts", "peers: restarts %d; use 1 to 1000 (default %d)", p.Restarts, DefaultPeerRestarts)
	}
	if p.Resamples != nil && (*p.Resamples < 0 || *p.Resamples > 500) {
		bad("resamples", "peers: resamples %d; use 0 (no stability check) to 500 (default %d)", *p.Resamples, DefaultPeerResamples)
	}
	switch {
	case p.Nearest == 0:
		p.Nearest = DefaultPeerNearest
	case p.Nearest < 1 || p.Nearest > 50:
		bad("nearest", "peers: nearest %d; use 1 to 50 (default %d)", p.Nearest, DefaultPeerNearest)
	}
	switch p.Standardise {
	case "":
		p.Standardise = "sd"
	case "sd", "none":
	default:
		bad("standardise", "peers: standardise %q; use sd (default: mean 0, sample SD 1) or none (raw values)", p.Standardise)
	}
	if p.Year == 0 {
		p.Year = b.Year
	}
}

// ClustersBlock lays out the peer-group section of the peers: front
// matter: the cluster table with generated descriptions, the sector map,
// the silhouette curve, the stability and the focus's nearest profiles,
// with commentary citing the figures.
type ClustersBlock struct {
	BlockBase `yaml:",inline"`
	// Show chooses and orders the parts (default: all, in ClustersParts
	// order).
	Show []string `yaml:"show"`
	// Loadings draws the indicators' loadings as arrows on the map.
	Loadings bool `yaml:"loadings"`
	// Label names institutions to mark on the map besides the focus,
	// its nearest profiles and each cluster's typical member.
	Label []string `yaml:"label"`
	// Caption is set under the map.
	Caption string `yaml:"caption"`
}

// Kind implements Block.
func (*ClustersBlock) Kind() string { return "clusters" }

// ClustersParts are the parts a clusters block can show.
var ClustersParts = []string{"text", "table", "map", "silhouette", "stability", "nearest"}
