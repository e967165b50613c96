package scan

import (
	"context"
	"math"

	"gonum.org/v1/gonum/dsp/fourier"
)

// Work limits of the verification path.
const (
	MaxViews      = 1 << 16 // views or source positions
	MaxDetectors  = 1 << 16 // detectors per view
	MaxOversample = 64      // oversampling factor of filtered projections
	MaxImageSize  = 1 << 13 // pixels per side
	maxFineLen    = 1 << 22 // M·(N−1): length of one oversampled filtered projection
	maxRays       = 1 << 27 // views × detectors in one sinogram
	maxBackproj   = 2e10    // pixels × views in one reconstruction
)

// ParallelScan is a parallel-beam sampling: Views directions φ_j = jπ/p
// (j = 0..p−1) and Detectors rays per view at
//
//	s_l = (l − (N−1)/2)·Δs + e_j·Δs/2,   l = 0..N−1,
//
// with e_j = 0 (standard scheme), or e_j = j mod 2 (interlaced scheme: the
// detector grid moves by half a spacing from one view to the next; p must
// be even so that the views over 180° and their mirror images over the
// other 180° form one interlaced lattice).
type ParallelScan struct {
	Views      int     // p ≥ 1 (even when Interlaced)
	Detectors  int     // N ≥ 2
	Spacing    float64 // Δs > 0
	Interlaced bool
}

// offset returns the position of detector 0 in view j.
func (g ParallelScan) offset(j int) float64 {
	s0 := -0.5 * float64(g.Detectors-1) * g.Spacing
	if g.Interlaced && j%2 == 1 {
		s0 += 0.5 * g.Spacing
	}
	return s0
}

// Validate checks the scan; errors name "parallel.views" etc.
func (g ParallelScan) Validate() error {
	if g.Views < 1 || g.Views > MaxViews {
		return countErr("parallel.views", g.Views, 1, MaxViews)
	}
	if g.Detectors < 2 || g.Detectors > MaxDetectors {
		return countErr("parallel.detectors", g.Detectors, 2, MaxDetectors)
	}
	if err := positive("parallel.spacing", g.Spacing); err != nil {
		return err
	}
	if g.Interlaced && g.Views%2 != 0 {
		return invalid("parallel.views", "interlaced scheme needs an even number of views, got %d", g.Views)
	}
	if g.Views*g.Detectors > maxRays {
		return workLimit("parallel", "%d views × %d detectors exceeds %d rays", g.Views, g.Detectors, maxRays)
	}
	return nil
}

// countErr reports a count outside [lo, hi]: too large is a work limit.
func countErr(param string, v, lo, hi int) error {
	if v > hi {
		return workLimit(param, "must be at most %d, got %d", hi, v)
	}
	return invalid(param, "must be at least %d, got %d", lo, v)
}

// Sinogram holds samples row by row: Data[j*Detectors + l] is view (or
// source position) j, detector l.
type Sinogram struct {
	Views, Detectors int
	Data             []float64
}

// ParallelSinogram returns the exact parallel-beam samples Rf(θ_j, s_l) of
// the phantom (closed form, see Blob).
func (p Phantom) ParallelSinogram(g ParallelScan) (Sinogram, error) {
	return p.parallelSinogram(context.Background(), g)
}

// parallelSinogram is ParallelSinogram checking ctx once per view.
func (p Phantom) parallelSinogram(ctx context.Context, g ParallelScan) (Sinogram, error) {
	if err := p.Validate(); err != nil {
		return Sinogram{}, err
	}
	if err := g.Validate(); err != nil {
		return Sinogram{}, err
	}
	sino := Sinogram{Views: g.Views, Detectors: g.Detectors, Data: make([]float64, g.Views*g.Detectors)}
	views := make([]blobView, len(p.Blobs))
	for j := range g.Views {
		if err := ctx.Err(); err != nil {
			return Sinogram{}, err
		}
		phi := math.Pi * float64(j) / float64(g.Views)
		sn, c := math.Sincos(phi)
		for i, b := range p.Blobs {
			views[i] = b.view(phi, c, sn)
		}
		s0 := g.offset(j)
		row := sino.Data[j*g.Detectors : (j+1)*g.Detectors]
		for l := range row {
			s := s0 + float64(l)*g.Spacing
			var sum float64
			for _, v := range views {
				sum += v.at(s)
			}
			row[l] = sum
		}
	}
	return sino, nil
}

// Options controls a filtered backprojection.
type Options struct {
	Size   int     // n: the image has n×n pixels
	Width  float64 // side of the square image, centred on the rotation axis
	Window Window  // ramp filter window

	// Oversample M ≥ 1 evaluates the filtered projections at spacing Δs/M
	// (zero-padded FFT convolution with the continuous kernel) before the
	// linear interpolation of the backprojection; 0 means 1.
	Oversample int
}

func (o Options) validate() (int, error) {
	if o.Size < 1 || o.Size > MaxImageSize {
		return 0, countErr("fbp.size", o.Size, 1, MaxImageSize)
	}
	if err := positive("fbp.width", o.Width); err != nil {
		return 0, err
	}
	if !o.Window.valid() {
		return 0, invalid("fbp.window", "unknown window %d", int(o.Window))
	}
	m := o.Oversample
	if m == 0 {
		m = 1
	}
	if m < 1 || m > MaxOversample {
		return 0, countErr("fbp.oversample", m, 1, MaxOversample)
	}
	return m, nil
}

// Image is an n×n pixel image of side Width centred on the rotation axis.
// Pix[iy*Size + ix] belongs to the pixel centre
// (x, y) = (−W/2 + (ix+½)W/n, −W/2 + (iy+½)W/n).
type Image struct {
	Size  int
	Width float64
	Pix   []float64
}

// Centre returns the coordinate of pixel centre i along either axis.
func (im Image) Centre(i int) float64 {
	px := im.Width / float64(im.Size)
	return -0.5*im.Width + (float64(i)+0.5)*px
}

// convolver computes filtered projections
//
//	Q(t_m) = τ Σ_l g_l h(t_m − s_l),   t_m = s_0 + mτ/M,  m = 0..M(N−1),
//
// the trapezoidal rule for (g * h)(t) (Natterer, Acta Numerica 8 (1999)
// §2), as one linear convolution of the zero-stuffed samples with the
// kernel sampled at τ/M, done by a zero-padded real FFT (gonum dsp/fourier)
// of length L ≥ 2M(N−1)+1, which leaves no circular wrap-around.
type convolver struct {
	n, m, out int
	fft       *fourier.FFT
	kspec     []complex128
	spec      []complex128
	buf       []float64
	scale     float64
}

func newConvolver(n, m int, tau float64, kernel func(float64) float64) *convolver {
	k := m * (n - 1)
	size := 1
	for size < 2*k+1 {
		size <<= 1
	}
	fft := fourier.NewFFT(size)
	kern := make([]float64, size)
	for i := -k; i <= k; i++ {
		kern[(i+size)%size] = kernel(float64(i) * tau / float64(m))
	}
	return &convolver{
		n: n, m: m, out: k + 1,
		fft:   fft,
		kspec: fft.Coefficients(nil, kern),
		spec:  make([]complex128, size/2+1),
		buf:   kern, // reused as work space
		scale: tau / float64(size),
	}
}

// apply writes the M(N−1)+1 filtered values of row into dst.
func (c *convolver) apply(dst, row []float64) {
	clear(c.buf)
	for l, v := range row {
		c.buf[l*c.m] = v
	}
	c.fft.Coefficients(c.spec, c.buf)
	for i, v := range c.kspec {
		c.spec[i] *= v
	}
	c.fft.Sequence(c.buf, c.spec)
	for i := range dst[:c.out] {
		dst[i] = c.buf[i] * c.scale
	}
}

// ReconstructParallel inverts a parallel-beam sinogram by filtered
// backprojection,
//
//	f(x) ≈ (1/2π)·(π/p) Σ_j Q_j(x·θ_j),   Q_j = trapezoidal (g(φ_j,·) * h),
//
// the discretised inversion formula f = (1/2π) ∫_0^π (g(φ,·) * h)(x·θ) dφ
// (kernel h: Window.kernel). Q_j is evaluated on a grid of spacing Δs/M
// and interpolated linearly. Filtered values beyond the detector ends
// count as 0. It checks ctx once per view.
func ReconstructParallel(ctx context.Context, g ParallelScan, sino Sinogram, opt Options) (Image, error) {
	if err := g.Validate(); err != nil {
		return Image{}, err
	}
	m, err := opt.validate()
	if err != nil {
		return Image{}, err
	}
	if err := checkSinogram(sino, g.Views, g.Detectors); err != nil {
		return Image{}, err
	}
	if m*(g.Detectors-1) > maxFineLen {
		return Image{}, workLimit("fbp.oversample", "oversampled projection of %d values exceeds %d", m*(g.Detectors-1), maxFineLen)
	}
	n := opt.Size
	if float64(n)*float64(n)*float64(g.Views) > maxBackproj {
		return Image{}, workLimit("fbp.size", "%d² pixels × %d views exceeds %g", n, g.Views, maxBackproj)
	}
	tau := g.Spacing // kernel cut-off π/τ
	if g.Interlaced {
		tau /= 2
	}
	conv := newConvolver(g.Detectors, m, g.Spacing, func(s float64) float64 { return opt.Window.kernel(s, tau) })
	q := make([]float64, conv.out)
	qd := make([]float64, 2*(conv.out-1))
	im := Image{Size: n, Width: opt.Width, Pix: make([]float64, n*n)}
	inv := float64(m) / g.Spacing
	px := opt.Width / float64(n)
	x0 := -0.5*opt.Width + 0.5*px
	for j := range g.Views {
		if err := ctx.Err(); err != nil {
			return Image{}, err
		}
		conv.apply(q, sino.Data[j*g.Detectors:(j+1)*g.Detectors])
		pairs(qd, q)
		s0 := g.offset(j)
		sn, cs := math.Sincos(math.Pi * float64(j) / float64(g.Views))
		du := px * cs * inv
		for iy := range n {
			y := x0 + float64(iy)*px
			u0 := (x0*cs + y*sn - s0) * inv
			backprojectRow(im.Pix[iy*n:(iy+1)*n], qd, u0, du)
		}
	}
	scale := 1 / (2 * float64(g.Views))
	for i := range im.Pix {
		im.Pix[i] *= scale
	}
	return im, nil
}

// backprojectRow adds Q(u0 + i·du), linearly interpolated on the index
// scale of the filtered projection, to row[i]; positions outside it
// contribute 0. qd holds the pairs (Q_k, Q_{k+1} − Q_k), k = 0..len−2, so
// that one slice bound check serves both values.
func backprojectRow(row, qd []float64, u0, du float64) {
	last := float64(len(qd) / 2) // u must lie in [0, last)
	in := func(i int) bool {
		u := u0 + float64(i)*du
		return u >= 0 && u < last
	}
	lo, hi := 0, len(row)
	if du != 0 {
		// Solve 0 ≤ u0 + i·du < last for i, then settle rounding at the ends.
		a, b := -u0/du, (last-u0)/du
		if du < 0 {
			a, b = b, a
		}
		if a = math.Ceil(a) - 1; a > 0 && a < float64(len(row)) {
			lo = int(a)
		}
		if b = math.Floor(b) + 2; b >= 0 && b < float64(len(row)) {
			hi = int(b)
		}
	}
	for lo < hi && !in(lo) {
		lo++
	}
	for hi > lo && !in(hi-1) {
		hi--
	}
	for i := lo; i < hi; i++ {
		u := u0 + float64(i)*du
		k := int(u)
		f := u - float64(k)
		p := qd[2*k : 2*k+2 : 2*k+2]
		row[i] += p[0] + f*p[1]
	}
}

// pairs fills qd with (q_k, q_{k+1} − q_k) for k = 0..len(q)−2.
func pairs(qd, q []float64) {
	for k := 0; k+1 < len(q); k++ {
		qd[2*k] = q[k]
		qd[2*k+1] = q[k+1] - q[k]
	}
}

func checkSinogram(s Sinogram, views, dets int) error {
	if s.Views != views || s.Detectors != dets || len(s.Data) != views*dets {
		return invalid("sinogram", "shape %d×%d with %d values does not match the scan %d×%d",
			s.Views, s.Detectors, len(s.Data), views, dets)
	}
	for i, v := range s.Data {
		if !finite(v) {
			return invalid("sinogram.data", "value %d is %g", i, v)
		}
	}
	return nil
}

// ImageError compares a reconstruction with the phantom at the pixel
// centres inside a disc.
type ImageError struct {
	RelRMS float64 // ‖f_rec − f‖₂ / ‖f‖₂ over the pixels in the disc
	MaxAbs float64 // max |f_rec − f| over the same pixels
	Peak   float64 // max |f| over the same pixels, for scale
	Pixels int     // number of pixels compared
}

// Compare measures the error of im against the phantom over the pixel
// centres with |x| ≤ radius.
func (p Phantom) Compare(im Image, radius float64) (ImageError, error) {
	if err := p.Validate(); err != nil {
		return ImageError{}, err
	}
	if err := positive("compare.radius", radius); err != nil {
		return ImageError{}, err
	}
	if im.Size < 1 || len(im.Pix) != im.Size*im.Size {
		return ImageError{}, invalid("compare.image", "size %d with %d pixels", im.Size, len(im.Pix))
	}
	var e ImageError
	var num, den float64
	for iy := range im.Size {
		y := im.Centre(iy)
		for ix := range im.Size {
			x := im.Centre(ix)
			if x*x+y*y > radius*radius {
				continue
			}
			f := p.Value(x, y)
			d := im.Pix[iy*im.Size+ix] - f
			num += d * d
			den += f * f
			e.MaxAbs = math.Max(e.MaxAbs, math.Abs(d))
			e.Peak = math.Max(e.Peak, math.Abs(f))
			e.Pixels++
		}
	}
	if e.Pixels == 0 || den == 0 {
		return ImageError{}, invalid("compare.radius", "no pixel with nonzero phantom value within radius %g", radius)
	}
	e.RelRMS = math.Sqrt(num / den)
	return e, nil
}
