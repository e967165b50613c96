package bounds

import (
	"math"
	"math/cmplx"
	"sort"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// panelFourier approximates
//
//	∫_lo^hi f(x)·e^{-iξx} dx
//
// with n-point Gauss–Legendre rules (gonum quad.Legendre, the reference
// library) on panels no wider than width, with panel ends at every break
// inside (lo, hi) (kinks of f). It is the quadrature reference of the
// family tests.
func panelFourier(f func(float64) complex128, xi, lo, hi, width float64, n int, breaks ...float64) complex128 {
	pts := []float64{lo, hi}
	for _, b := range breaks {
		if b > lo && b < hi {
			pts = append(pts, b)
		}
	}
	sort.Float64s(pts)
	xs := make([]float64, n)
	ws := make([]float64, n)
	var sum complex128
	for i := 0; i+1 < len(pts); i++ {
		a, b := pts[i], pts[i+1]
		m := int(math.Ceil((b - a) / width))
		for j := 0; j < m; j++ {
			p0 := a + (b-a)*float64(j)/float64(m)
			p1 := a + (b-a)*float64(j+1)/float64(m)
			quad.Legendre{}.FixedLocations(xs, ws, p0, p1)
			var part complex128
			for k, x := range xs {
				part += complex(ws[k], 0) * f(x) * cmplx.Exp(complex(0, -xi*x))
			}
			sum += part
		}
	}
	return sum
}

// panelWidth picks a panel width resolving both the scale of f and the
// oscillation at frequency ξ.
func panelWidth(scale, xi float64) float64 {
	w := scale
	if xi != 0 {
		w = math.Min(w, 1/math.Abs(xi))
	}
	return w
}

// transformCase is one quadrature check of a family's Transform.
type transformCase struct {
	name string
	fam  Family
	f    func(float64) complex128 // f written out independently of the family
	xis  []float64
	// lo, hi, width, breaks: integration window and panels.
	lo, hi, scale float64
	breaks        []float64
	// tail returns the analytic correction for |x| outside the window
	// (added to the quadrature) and a bound on what it leaves out.
	tail func(xi float64) (corr complex128, bound float64)
	// tol is the allowed |Transform - reference| beyond the tail bound,
	// absolute plus relative to |reference|.
	abs, rel float64
}

// checkTransforms compares Transform with panelFourier for each case.
func checkTransforms(t *testing.T, tests []transformCase) {
	t.Helper()
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			// For the log: the largest |diff|/|reference| where |F| is at
			// least 10⁻⁴·F(0), and the largest |diff|/F(0) anywhere.
			worstRel, worstAbs := 0.0, 0.0
			f0 := tt.fam.Transform(Point(0)).Mag()
			defer func() {
				t.Logf("%v: worst relative difference %.2g, worst difference/F(0) %.2g", tt.fam, worstRel, worstAbs)
			}()
			for _, xi := range tt.xis {
				ref := panelFourier(tt.f, xi, tt.lo, tt.hi, panelWidth(tt.scale, xi), 24, tt.breaks...)
				bound := 0.0
				if tt.tail != nil {
					c, b := tt.tail(xi)
					ref += c
					bound = b
				}
				got := tt.fam.Transform(Point(xi))
				if !got.IsFinite() {
					t.Fatalf("F(%g) = %v, not finite", xi, got)
				}
				err := cmplx.Abs(got.Mid() - ref)
				if r := cmplx.Abs(ref); r >= 1e-4*f0 {
					worstRel = math.Max(worstRel, err/r)
				}
				worstAbs = math.Max(worstAbs, err/f0)
				allowed := tt.abs + tt.rel*cmplx.Abs(ref) + bound
				if err > allowed {
					t.Errorf("%v: F(%g) = %v, want %v (gonum quad.Legendre), |diff| %.3g > %.3g",
						tt.fam, xi, got, ref, err, allowed)
				}
				// The enclosure is narrow: its width stays far below the
				// quadrature tolerance.
				if w := math.Max(got.Re.Width(), got.Im.Width()); w > 1e-13*math.Max(1, got.Mag()) {
					t.Errorf("%v: F(%g) = %v, enclosure width %.3g", tt.fam, xi, got, w)
				}
			}
		})
	}
}
