package scan_test

import (
	"fmt"
	"math"

	"foldbound/bounds/scan"
)

// A parallel-beam plan for an invented 40 mm test cylinder at 0.25 mm
// resolution.
func ExamplePlan() {
	res, err := scan.Plan(scan.Request{Radius: 20, Resolution: 0.25})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Ω = %.4f rad/mm\n", res.Bandwidth)
	for _, l := range []scan.Layout{res.Standard, res.Interlaced} {
		fmt.Printf("%-10s Δs = %.3f mm, %d detectors, %d views over %.0f°, %d samples\n",
			l.Scheme, l.DetectorSpacing, l.Detectors, l.Views, l.Arc*180/math.Pi, l.Samples)
	}
	fmt.Println(res.Caution)
	// Output:
	// Ω = 12.5664 rad/mm
	// standard   Δs = 0.250 mm, 161 detectors, 252 views over 180°, 40572 samples
	// interlaced Δs = 0.500 mm, 81 detectors, 276 views over 180°, 22218 samples
	// These are sampling conditions from the mathematics of the Radon transform (object radius and essential band limit), not a scan protocol. Radiation dose, safety and clinical use are matters for licensed practice and local regulations.
}

// A fan-beam plan: an invented 500 mm field of view, source circle of
// radius 570 mm, band limit 2π rad/mm (0.5 mm resolution).
func ExamplePlan_fanBeam() {
	res, err := scan.Plan(scan.Request{Geometry: scan.FanBeam, Radius: 250, Bandwidth: 2 * math.Pi, SourceRadius: 570})
	if err != nil {
		fmt.Println(err)
		return
	}
	l := res.Standard
	fmt.Printf("fan angle %.2f°, Δα = %.5f° (%.3f mm at the axis), %d detectors, %d sources over 360°\n",
		res.FanAngle*180/math.Pi, l.DetectorAngle*180/math.Pi, l.DetectorSpacing, l.Detectors, l.Views)
	fmt.Println(res.Interlaced.Offered)
	// Output:
	// fan angle 52.03°, Δα = 0.03492° (0.347 mm at the axis), 1491 detectors, 5596 sources over 360°
	// false
}
