package client

import pb "foldbound/api/foldbound/v1"

// Constructors of the common request parts. Each returns a new message;
// parameters are checked by the server, not here.

// Gaussian is exp(-x²/(2σ²)).
func Gaussian(sigma float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_Gaussian{Gaussian: &pb.Gaussian{Sigma: sigma}}}
}

// TwoSidedExponential is exp(-a|x|).
func TwoSidedExponential(a float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_TwoSidedExponential{TwoSidedExponential: &pb.TwoSidedExponential{A: a}}}
}

// Lorentzian is 1/(a²+x²).
func Lorentzian(a float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_Lorentzian{Lorentzian: &pb.Lorentzian{A: a}}}
}

// Sech is sech(x/w).
func Sech(w float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_Sech{Sech: &pb.Sech{W: w}}}
}

// SechSquared is sech²(x/w).
func SechSquared(w float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_SechSquared{SechSquared: &pb.SechSquared{W: w}}}
}

// WavePacket is exp(-x²/(2σ²))·cos(ω0·x).
func WavePacket(sigma, omega0 float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_WavePacket{WavePacket: &pb.WavePacket{Sigma: sigma, Omega0: omega0}}}
}

// Fejer is (sin(Ωx/2)/(Ωx/2))², band-limited to |ξ| ≤ Ω.
func Fejer(omega float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_Fejer{Fejer: &pb.Fejer{Omega: omega}}}
}

// BSpline is the centred cardinal B-spline of order m.
func BSpline(order int32) *pb.Family {
	return &pb.Family{Kind: &pb.Family_BSpline{BSpline: &pb.BSpline{Order: order}}}
}

// KaiserBessel is the Kaiser-Bessel window of width W (support
// [-W/2, W/2]) and shape β.
func KaiserBessel(width, beta float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_KaiserBessel{KaiserBessel: &pb.KaiserBessel{Width: width, Beta: beta}}}
}

// Scaled is c·f(x).
func Scaled(c complex128, f *pb.Family) *pb.Family {
	return &pb.Family{Kind: &pb.Family_Amplitude{Amplitude: &pb.Amplitude{
		Factor: &pb.ComplexNumber{Re: real(c), Im: imag(c)}, Of: f}}}
}

// Shifted is f(x - by).
func Shifted(f *pb.Family, by float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_Shift{Shift: &pb.Shift{By: by, Of: f}}}
}

// Dilated is f(x/a).
func Dilated(f *pb.Family, a float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_Dilation{Dilation: &pb.Dilation{Factor: a, Of: f}}}
}

// Modulated is f(x)·exp(iω0·x).
func Modulated(f *pb.Family, omega0 float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_Modulation{Modulation: &pb.Modulation{Omega0: omega0, Of: f}}}
}

// Sum is f_1 + … + f_k.
func Sum(fs ...*pb.Family) *pb.Family {
	return &pb.Family{Kind: &pb.Family_Sum{Sum: &pb.FamilySum{Terms: fs}}}
}

// Separable is f_1(x_1)·…·f_n(x_n).
func Separable(fs ...*pb.Family) *pb.Family {
	return &pb.Family{Kind: &pb.Family_Separable{Separable: &pb.Separable{Factors: fs}}}
}

// RadialGaussian is exp(-|x-c|²/(2σ²)) in dim dimensions (center empty for
// the origin).
func RadialGaussian(dim int32, sigma float64, center ...float64) *pb.Family {
	return &pb.Family{Kind: &pb.Family_RadialGaussian{RadialGaussian: &pb.RadialGaussian{Dim: dim, Sigma: sigma, Center: center}}}
}

// Grid is a finite grid of count samples centred on shift (count 0: the
// infinite grid).
func Grid(step, shift float64, count int64) *pb.Grid {
	return &pb.Grid{Step: step, Shift: shift, Count: count}
}
