package bounds

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"
)

// profileValue evaluates a centred envelope term in float64, as the test's
// own reading of the definition A·g(max(0, d - p)).
func profileValue(t EnvelopeTerm, d float64) float64 {
	u := math.Max(0, d-t.Plateau)
	switch t.Decay {
	case Exponential:
		return t.Amplitude * math.Exp(-t.Rate*u)
	case Gaussian:
		return t.Amplitude * math.Exp(-u*u/(2*t.Width*t.Width))
	case Algebraic:
		return t.Amplitude * math.Pow(1+u/t.Width, -t.Power)
	case Compact:
		if u <= t.Width {
			return t.Amplitude
		}
	}
	return 0
}

// TestTailBoundNeverBelowTrue checks the counting tail bound
// (pointCounter.tail; the Gram-Schmidt and Voronoi counting bounds with
// summation by parts, proved in latticecount.go) against the true
// remainder Σ_{|v-t|>R} P(|v-t|) summed directly by the test over every
// lattice point out to a radius where the rest is negligible (below 1e-25
// of the remainder for the Gaussian and exponential profiles; zero for the
// compact one). For the algebraic profile the direct sum stops at a finite
// radius, so it is a lower bound of the true remainder and the check is
// one-sided; its tightness is not reported.
func TestTailBoundNeverBelowTrue(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 4))
	z2, _ := IntegerLattice(2)
	skew, _ := NewLattice([][]float64{{1, 0.3}, {0, 0.05}})
	lats := append(namedTestLattices(), randomTestLattices(t)...)
	lats = append(lats, testLattice{"square", z2, z2.Generator()}, testLattice{"skew", skew, skew.Generator()})
	ratios := map[string][]float64{}
	for _, tl := range lats {
		n := tl.lat.Dim()
		sc := math.Pow(tl.lat.Covolume().Mid(), 1/float64(n))
		profiles := []struct {
			kind string
			term EnvelopeTerm
			far  float64 // direct-sum radius beyond R
		}{
			{"gaussian", EnvelopeTerm{Decay: Gaussian, Amplitude: 1, Width: 0.5 * sc}, 0.5 * sc * 11},
			{"gaussian-plateau", EnvelopeTerm{Decay: Gaussian, Amplitude: 2, Width: 0.4 * sc, Plateau: 0.3 * sc}, 0.4*sc*11 + 0.3*sc},
			{"exponential", EnvelopeTerm{Decay: Exponential, Amplitude: 1, Rate: 6 / sc}, sc / 6 * 62},
			{"compact", EnvelopeTerm{Decay: Compact, Amplitude: 1, Width: 2 * sc, Plateau: 0.2 * sc}, 2.3 * sc},
			{"algebraic", EnvelopeTerm{Decay: Algebraic, Amplitude: 1, Width: sc, Power: float64(n) + 1.5}, 8 * sc},
		}
		pc := tl.lat.d.primal.counter(Point(1))
		for _, p := range profiles {
			prof := Envelope{p.term}
			for _, R := range []float64{0.5 * sc, 1.5 * sc, 3 * sc} {
				c := make([]float64, n)
				for i := range c {
					c[i] = (rng.Float64()*2 - 1) * sc
				}
				var rem, inside float64
				forEachPoint(tl.good, make([]float64, n), c, R+p.far, func(_ []int64, x []float64) {
					d := 0.0
					for i := range x {
						d += (x[i] - c[i]) * (x[i] - c[i])
					}
					d = math.Sqrt(d)
					if d > R*(1+1e-12) {
						rem += profileValue(p.term, d)
					} else if d <= R*(1-1e-12) {
						inside++
					}
				})
				for _, nIn := range []float64{inside, 0} {
					b := pc.tail(prof, R, nIn)
					if b < rem*(1-1e-9) {
						t.Errorf("%s %s R=%.3g nIn=%g: tail bound %.6g below the true remainder %.6g",
							tl.name, p.kind, R, nIn, b, rem)
					}
					if nIn > 0 && rem > 1e-300 && p.kind != "algebraic" {
						ratios[p.kind] = append(ratios[p.kind], b/rem)
					}
				}
			}
		}
	}
	for kind, r := range ratios {
		sort.Float64s(r)
		t.Logf("%s: tail bound / true remainder: min %.3g, median %.3g, max %.3g over %d cases",
			kind, r[0], r[len(r)/2], r[len(r)-1], len(r))
	}
}
