package bounds

import (
	"context"
	"errors"
	"math"
	"testing"
)

// The n-D budget must cover the exact error of a separable product, which
// AliasSumND encloses (and which is checked against math/big elsewhere),
// and the error of a float64 double sum against the closed form
// F(0) = (σ√(2π))·(πw) (the Gaussian and sech integrals, DLMF 7.7.6 and
// 4.20 by substitution, from memory).
func TestFamilyBudgetNDCoversExactError(t *testing.T) {
	ctx := context.Background()
	gx, gy := GaussianFamily{Sigma: 1}, SechFamily{Width: 0.5}
	f := Separable{Axes: []Family{gx, gy}}
	for _, grids := range [][]Grid{
		{{Step: 0.9, Shift: 0.1, Count: 9}, {Step: 0.4, Shift: -0.05, Count: 21}},
		{{Step: 0.6, Count: 15}, {Step: 0.25, Shift: 0.1, Count: 40}},
		{{Step: 1.2, Shift: 0.3}, {Step: 0.5, Count: 11}},
	} {
		for _, anyShift := range []bool{false, true} {
			axes := []BudgetAxis{{Family: gx, Grid: grids[0]}, {Family: gy, Grid: grids[1]}}
			b, err := FamilyBudgetND(ctx, axes, BudgetOptions{AnyShift: anyShift})
			if err != nil {
				t.Fatal(err)
			}
			r, err := AliasSumND(ctx, f, grids, []float64{0, 0}, Settings{})
			if err != nil {
				t.Fatal(err)
			}
			if e := r.Error.Mag(); b.Aliasing+b.Truncation < r.Error.Mig() {
				t.Errorf("grids %+v: aliasing + truncation %g < |T - F| %g", grids, b.Aliasing+b.Truncation, e)
			}
			if grids[0].Count > 0 {
				exact := math.Sqrt(2*math.Pi) * math.Pi * 0.5
				var s float64
				lx, hx := grids[0].Indices()
				ly, hy := grids[1].Indices()
				for i := lx; i <= hx; i++ {
					x := grids[0].Shift + grids[0].Step*float64(i)
					for j := ly; j <= hy; j++ {
						y := grids[1].Shift + grids[1].Step*float64(j)
						s += math.Exp(-x*x/2) / math.Cosh(y/0.5)
					}
				}
				s *= grids[0].Step * grids[1].Step
				if err := math.Abs(s - exact); err > b.Total {
					t.Errorf("grids %+v: float64 error %g > budget %g", grids, err, b.Total)
				}
			}
			t.Logf("grids %+v any=%v: budget %.3g, |T - F| %.3g", grids, anyShift, b.Total, r.Error.Mag())
		}
	}
}

func TestFamilyBudgetNDErrors(t *testing.T) {
	ctx := context.Background()
	if _, err := FamilyBudgetND(ctx, nil, BudgetOptions{}); !errors.Is(err, ErrInvalid) {
		t.Errorf("no axes: %v", err)
	}
	axes := []BudgetAxis{{Family: GaussianFamily{Sigma: 1}, Grid: Grid{Step: 1, Count: 5}}, {Family: GaussianFamily{Sigma: 1}, Grid: Grid{Step: -1}}}
	_, err := FamilyBudgetND(ctx, axes, BudgetOptions{})
	var pe *ParamError
	if !errors.As(err, &pe) || pe.Param != "axes[1].grid.step" {
		t.Errorf("bad step on axis 1: %v, want a ParamError at axes[1].grid.step", err)
	}
}
