package bounds

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"testing"

	"foldbound/internal/bigref"
)

// theta3 returns θ3(z, q) = 1 + 2 Σ_{n≥1} q^{n²} cos(2nz) (DLMF 20.2.3)
// for real 0 < q < 1 and complex z, summed in math/big until the terms
// fall below 2⁻³⁴⁰ of the sum. cos(2nz) = (w^n + w^{-n})/2 with
// w = e^{2iz}; q^{n²} and w^n are advanced by multiplication.
func theta3(z bigref.Complex, q *big.Float) bigref.Complex {
	// w = e^{2iz} = e^{-2 Im z}·e^{2i Re z}
	two := bigref.Int(2)
	w := bigref.Cis(bigref.Mul(two, z.Re)).Scale(bigref.Exp(bigref.Neg(bigref.Mul(two, z.Im))))
	wi := bigref.Cis(bigref.Neg(bigref.Mul(two, z.Re))).Scale(bigref.Exp(bigref.Mul(two, z.Im)))
	sum := bigref.Real(bigref.Int(1))
	qn2 := bigref.Int(1) // q^{n²}
	q2n1 := q            // q^{2n+1}, starting at n = 0
	q2 := bigref.Mul(q, q)
	wn, win := w, wi
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -340)
	for n := 1; n < 100000; n++ {
		qn2 = bigref.Mul(qn2, q2n1)
		q2n1 = bigref.Mul(q2n1, q2)
		term := wn.Add(win).Scale(qn2)
		sum = sum.Add(term)
		if bigref.Quo(term.Abs(), sum.Abs()).Cmp(eps) < 0 && n > 2 {
			// Beyond this n the terms shrink at least geometrically:
			// q^{2n+1}·max(|w|, 1/|w|) < 1/2, so the rest is below the
			// last term.
			if bigref.Mul(q2n1, bigref.Add(w.Abs(), wi.Abs())).Cmp(bigref.New(0.5)) < 0 {
				return sum
			}
		}
		wn, win = wn.Mul(w), win.Mul(wi)
	}
	panic("theta3: series did not converge")
}

// TestGaussianThetaJacobi checks AliasSum on the Gaussian against the
// Jacobi imaginary transformation of θ3 (DLMF 20.7.32, θ3 as defined by
// DLMF 20.2.3). On the infinite grid x_k = s + hk,
//
//	T = h Σ_k e^{-(s+hk)²/(2σ²)} e^{-iξ(s+hk)} = h e^{-s²/(2σ²) - iξs} θ3(z | τ),
//	z = -ξh/2 + i sh/(2σ²),  q = e^{iπτ} = e^{-h²/(2σ²)},
//
// and DLMF 20.7.32, (-iτ)^{1/2} θ3(z|τ) = e^{iτ'z²/π} θ3(zτ'|τ'),
// τ' = -1/τ, turns it into the spectral side (q' = e^{-2π²σ²/h²}). Both
// series are summed in math/big; the test checks that they agree (to
// 1e-80), then that AliasSum, forced to each side, encloses T, F(ξ) and
// T - F. Steps run from coarse (|T - F| ≈ 0.3 F) to fine (|T - F| ≈ 1e-30
// F); on the spectral side the error must keep relative width ≤ 1e-12
// however small it is.
func TestGaussianThetaJacobi(t *testing.T) {
	type tcase struct{ sigma, hOverSigma, shiftOverH, xiTimesH float64 }
	var cases []tcase
	for i, r := range []float64{4, 2.5, 1.5, 1, 0.7, 0.53} {
		for j, s := range []float64{0, 0.3, -0.77, 5.1} {
			xiH := []float64{0, 0.4, -0.9 * math.Pi, 2.0}[(i+j)%4]
			sigma := []float64{1, 0.37}[(i+j)%2]
			cases = append(cases, tcase{sigma, r, s, xiH})
		}
	}
	worstSpecRel := 0.0
	minErr, maxErr := math.Inf(1), 0.0 // |T - F|/F(0) over the cases
	for _, c := range cases {
		sigma := c.sigma
		h := c.hOverSigma * sigma
		s := c.shiftOverH * h
		xi := c.xiTimesH / h
		g := GaussianFamily{Sigma: sigma}
		name := fmt.Sprintf("σ=%g h=%g s=%g ξ=%g", sigma, h, s, xi)

		bs, bh, bx := bigref.New(sigma), bigref.New(h), bigref.New(xi)
		bS := bigref.New(s)
		s2 := bigref.Mul(bs, bs)
		two := bigref.Int(2)
		// Spatial form: T = h e^{-s²/(2σ²) - iξs} θ3(z, q).
		q := bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(bh, bh), bigref.Mul(two, s2))))
		z := bigref.Complex{
			Re: bigref.Neg(bigref.Quo(bigref.Mul(bx, bh), two)),
			Im: bigref.Quo(bigref.Mul(bS, bh), bigref.Mul(two, s2)),
		}
		pre := bigref.Cis(bigref.Neg(bigref.Mul(bx, bS))).Scale(
			bigref.Mul(bh, bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(bS, bS), bigref.Mul(two, s2))))))
		T := pre.Mul(theta3(z, q))

		// Transformed form: θ3(z|τ) = (-iτ)^{-1/2} e^{iτ'z²/π} θ3(zτ'|τ'),
		// -iτ = h²/(2πσ²), iτ'/π = -2σ²/h², zτ' = i(2πσ²/h²) z.
		pi := bigref.Pi()
		c2 := bigref.Quo(bigref.Mul(bigref.Mul(two, pi), s2), bigref.Mul(bh, bh)) // 2πσ²/h² = 1/(-iτ)
		qp := bigref.Exp(bigref.Neg(bigref.Mul(pi, c2)))                          // e^{-2π²σ²/h²}
		zp := bigref.Complex{Re: bigref.Neg(bigref.Mul(c2, z.Im)), Im: bigref.Mul(c2, z.Re)}
		z2 := z.Mul(z)
		k := bigref.Neg(bigref.Quo(bigref.Mul(two, s2), bigref.Mul(bh, bh)))
		ez2 := bigref.Cis(bigref.Mul(k, z2.Im)).Scale(bigref.Exp(bigref.Mul(k, z2.Re)))
		T2 := pre.Mul(ez2.Mul(theta3(zp, qp)).Scale(bigref.Sqrt(c2)))
		if e := bigref.Float64(bigref.Quo(T.Sub(T2).Abs(), T.Abs())); e > 1e-80 {
			t.Fatalf("%s: θ3 and its Jacobi transform differ by %.3g (DLMF 20.7.32)", name, e)
		}

		// F(ξ) = σ√(2π) e^{-σ²ξ²/2}.
		sx := bigref.Mul(bs, bx)
		F := bigref.Mul(bigref.Mul(bs, bigref.Sqrt(bigref.Mul(two, pi))), bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(sx, sx), two))))
		E := T.Sub(bigref.Real(F))
		rel := bigref.Float64(E.Abs()) / (sigma * math.Sqrt(2*math.Pi))
		minErr, maxErr = math.Min(minErr, rel), math.Max(maxErr, rel)
		for _, side := range []Side{SpatialSide, SpectralSide} {
			r, err := AliasSum(context.Background(), g, Grid{Step: h, Shift: s}, xi, Settings{Side: side})
			if err != nil {
				t.Errorf("%s side=%v: %v", name, side, err)
				continue
			}
			for _, p := range []struct {
				what string
				z    Complex
				want bigref.Complex
			}{{"sampled", r.Sampled, T}, {"exact", r.Exact, bigref.Real(F)}, {"error", r.Error, E}, {"alias", r.Alias, E}} {
				if !p.want.In(p.z.Re.Lo, p.z.Re.Hi, p.z.Im.Lo, p.z.Im.Hi) {
					t.Errorf("%s side=%v: %s = %v, want it to contain %.17g%+.17gi (θ3, DLMF 20.7.32)", name, side, p.what, p.z,
						bigref.Float64(p.want.Re), bigref.Float64(p.want.Im))
				}
			}
			w := math.Max(r.Error.Re.Width(), r.Error.Im.Width())
			mag := bigref.Float64(E.Abs())
			switch side {
			case SpectralSide:
				worstSpecRel = math.Max(worstSpecRel, w/mag)
				if w > 1e-12*mag {
					t.Errorf("%s: spectral error = %v: relative width %.3g, want ≤ 1e-12 (|E| = %.3g)", name, r.Error, w/mag, mag)
				}
			case SpatialSide:
				// The spatial side sums terms of total size S = h Σ|f| ≈ σ√(2π).
				if S := sigma * math.Sqrt(2*math.Pi); w > 1e-13*S {
					t.Errorf("%s: spatial error = %v: width %.3g, want ≤ 1e-13·σ√(2π)", name, r.Error, w)
				}
			}
		}
	}
	t.Logf("%d cases, |T-F|/F(0) from %.3g to %.3g; worst relative width of the spectral-side error %.3g",
		len(cases), minErr, maxErr, worstSpecRel)
	if minErr > 1e-29 || maxErr < 1e-1 {
		t.Errorf("cases span |T-F|/F(0) from %.3g to %.3g, want from below 1e-29 to above 1e-1", minErr, maxErr)
	}
}
