package bounds

import "fmt"

// Summing 0.1 ten times in float64 gives 0.9999999999999999; the interval
// sum keeps the exact value 1 (and every rounding error) inside.
func ExampleInterval_Add() {
	tenth := Point(1).Div(Point(10)) // encloses 1/10, which float64 cannot hold
	var s Interval
	for i := 0; i < 10; i++ {
		s = s.Add(tenth)
	}
	fmt.Println(s.Contains(1), s.Width() < 1e-15)
	// Output: true true
}

// Exp stays finite up to ln MaxFloat64 ≈ 709.78 and then returns the
// overflow interval [MaxFloat64, +Inf].
func ExampleExp() {
	fmt.Printf("%.6e\n", Exp(Point(709.5)).Mid())
	fmt.Println(Exp(Point(710)))
	// Output:
	// 1.354986e+308
	// [1.7976931348623157e+308, +Inf]
}

// SinhcSqrt continues sinh(√z)/√z to z < 0 as sin(√-z)/√-z, as the
// Kaiser–Bessel transform needs on both sides of |ξ| = 2β/W.
func ExampleSinhcSqrt() {
	fmt.Printf("%.12f\n", SinhcSqrt(Point(9)).Mid())  // sinh(3)/3
	fmt.Printf("%.12f\n", SinhcSqrt(Point(-9)).Mid()) // sin(3)/3
	fmt.Printf("%.12f\n", SinhcSqrt(Point(0)).Mid())
	// Output:
	// 3.339291642470
	// 0.047040002687
	// 1.000000000000
}

// BesselI0 sums its power series with a certified remainder.
func ExampleBesselI0() {
	i0 := BesselI0(Point(1))
	fmt.Printf("%.12f %v\n", i0.Mid(), i0.RelWidth() < 1e-14)
	// Output: 1.266065877752 true
}
