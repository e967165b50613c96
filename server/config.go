package server

import (
	"fmt"
	"runtime"
	"time"

	"github.com/rs/zerolog"

	"foldbound/bounds"
)

// Config configures a Server. The zero value is usable: zero fields take
// the defaults documented beside them.
type Config struct {
	// Logger receives the structured request log. The zero Logger
	// discards everything.
	Logger zerolog.Logger
	// DisableReflection turns off gRPC server reflection (on by default).
	DisableReflection bool
	// SlowCall is the duration above which a successful call is logged at
	// info level; faster successful calls are logged at debug level.
	// Default 1s.
	SlowCall time.Duration
	// ShutdownGrace is how long Serve waits for in-flight calls and
	// streams after its context ends before it closes every connection.
	// Default 10s.
	ShutdownGrace time.Duration
	// Limits bound the size of requests and the work per request.
	Limits Limits
}

// Limits bound what one client can ask of the server. Zero fields take
// the defaults documented beside them.
type Limits struct {
	// MaxRecvMsgBytes is the largest request message accepted; larger
	// ones are answered RESOURCE_EXHAUSTED by gRPC. Default 4 MiB.
	MaxRecvMsgBytes int
	// MaxSendMsgBytes is the largest response message. Default 16 MiB.
	MaxSendMsgBytes int
	// MaxConcurrentStreams limits concurrent calls per connection.
	// Default 256.
	MaxConcurrentStreams uint32
	// DefaultTerms is the work limit of a request whose
	// settings.max_terms is 0. Default bounds.DefaultMaxTerms (2^20).
	DefaultTerms int64
	// MaxTerms caps settings.max_terms; larger values are lowered to it.
	// Default 2^24.
	MaxTerms int64
	// MaxCount is the largest sample count per axis of a grid. Default
	// 2^40.
	MaxCount int64
	// MaxFamilyNodes is the largest number of nodes in a family tree.
	// Default bounds.MaxComposeNodes (64), the engine's own limit for a
	// composed family.
	MaxFamilyNodes int
	// MaxFamilyDepth is the deepest nesting of a family tree. Default 32.
	MaxFamilyDepth int
	// MaxEnvelopeTerms is the largest number of terms in one envelope.
	// Default 64.
	MaxEnvelopeTerms int
	// MaxStreamItems is the largest number of items one Batch stream
	// accepts; the stream then ends with RESOURCE_EXHAUSTED after
	// answering the items before it. Default 2^20.
	MaxStreamItems int64
	// StreamWorkers is the number of items of one Batch stream computed
	// concurrently. Default GOMAXPROCS.
	StreamWorkers int
	// MaxCallDuration bounds every call and every Batch item whose
	// deadline is later or absent. Default 60s.
	MaxCallDuration time.Duration
}

// withDefaults returns c with zero fields replaced by their defaults.
func (c Config) withDefaults() Config {
	if c.SlowCall == 0 {
		c.SlowCall = time.Second
	}
	if c.ShutdownGrace == 0 {
		c.ShutdownGrace = 10 * time.Second
	}
	c.Limits = c.Limits.withDefaults()
	return c
}

func (l Limits) withDefaults() Limits {
	setInt := func(p *int, v int) {
		if *p == 0 {
			*p = v
		}
	}
	setInt64 := func(p *int64, v int64) {
		if *p == 0 {
			*p = v
		}
	}
	setInt(&l.MaxRecvMsgBytes, 4<<20)
	setInt(&l.MaxSendMsgBytes, 16<<20)
	if l.MaxConcurrentStreams == 0 {
		l.MaxConcurrentStreams = 256
	}
	setInt64(&l.DefaultTerms, bounds.DefaultMaxTerms)
	setInt64(&l.MaxTerms, 1<<24)
	setInt64(&l.MaxCount, 1<<40)
	setInt(&l.MaxFamilyNodes, bounds.MaxComposeNodes)
	setInt(&l.MaxFamilyDepth, 32)
	setInt(&l.MaxEnvelopeTerms, 64)
	setInt64(&l.MaxStreamItems, 1<<20)
	setInt(&l.StreamWorkers, runtime.GOMAXPROCS(0))
	if l.MaxCallDuration == 0 {
		l.MaxCallDuration = time.Minute
	}
	return l
}

// validate reports limits that cannot work.
func (c Config) validate() error {
	l := c.Limits
	switch {
	case c.SlowCall < 0 || c.ShutdownGrace < 0 || l.MaxCallDuration < 0:
		return fmt.Errorf("server: durations must be ≥ 0")
	case l.MaxRecvMsgBytes < 0 || l.MaxSendMsgBytes < 0:
		return fmt.Errorf("server: message size limits must be ≥ 0")
	case l.DefaultTerms < 0 || l.MaxTerms < 0 || l.DefaultTerms > l.MaxTerms:
		return fmt.Errorf("server: need 0 < DefaultTerms ≤ MaxTerms, got %d and %d", l.DefaultTerms, l.MaxTerms)
	case l.MaxCount < 0 || l.MaxCount > bounds.MaxCount:
		return fmt.Errorf("server: MaxCount must be between 1 and 2^53, got %d", l.MaxCount)
	case l.MaxFamilyNodes < 0 || l.MaxFamilyDepth < 0 || l.MaxEnvelopeTerms < 0:
		return fmt.Errorf("server: family and envelope limits must be ≥ 0")
	case l.MaxStreamItems < 0 || l.StreamWorkers < 0:
		return fmt.Errorf("server: stream limits must be ≥ 0")
	}
	return nil
}
