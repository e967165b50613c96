// Package server is the gRPC face of the engine in package bounds: it
// serves foldbound.v1.SamplingService, checks every field of a request
// before the engine sees it, converts between the wire types and the
// engine's, and maps every error to a gRPC status in one place
// (status.go).
//
// # Layout
//
//	config.go       Config and Limits, with their defaults
//	server.go       New, Serve, graceful shutdown, health and reflection
//	interceptors.go request ids, JSON logs, call deadlines, panic recovery
//	validate.go     field rules; violations name the field path
//	convert.go      wire <-> engine conversion, Fourier conventions
//	service.go      the unary calls
//	lattice.go      the lattice calls: rules, conversion, handlers
//	kernel.go       the gridding-kernel call: rules, conversion, handler
//	batch.go        the Batch stream
//	status.go       errors -> gRPC status codes
//
// # Codes
//
//	INVALID_ARGUMENT    a field breaks a rule (details: google.rpc.BadRequest)
//	RESOURCE_EXHAUSTED  a size or the work over this server's limits
//	OUT_OF_RANGE        no grid can meet the request in float64, or overflow
//	DEADLINE_EXCEEDED   the call's deadline ended the computation
//	CANCELLED           the caller went away
//	UNIMPLEMENTED       a call or family the engine of this build lacks
//	INTERNAL            a bug (logged with its stack)
//
// The server holds no state between calls and no package-level variables
// that change; everything it needs is in the Config passed to New.
package server
