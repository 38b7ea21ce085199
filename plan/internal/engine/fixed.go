package engine

import "sync/atomic"

// The flags' bits, in the order of the fields of flags: a set of flags as
// a number, which names the walk compiled for it (see compiled).
const (
	flExact uint16 = 1 << iota
	flPaths
	flInfl
	flLogged
	flSlope
	flAlone
	flOne
	flNone
	flSet
	flRuled
	flCapping
	flMatching
	flAccrue
	flTaxed
	flReach
)

// bits returns f as a set of the bits above.
func (f flags) bits() uint16 {
	var b uint16
	for i, on := range [...]bool{f.exact, f.paths, f.infl, f.logged, f.slope, f.alone, f.one, f.none,
		f.set, f.ruled, f.capping, f.matching, f.accrue, f.taxed, f.reach} {
		if on {
			b |= 1 << i
		}
	}
	return b
}

// The sets of flags of the walks commands make most, each compiled with its
// flags constants (see compiled): exact walks of a search, a ledger and a
// search for a date, with interest credited monthly or accrued between
// credits; and the smooth walks that give a search its slope and the
// equation of value its terms.
const (
	setExact        = flExact
	setLedger       = flExact | flLogged
	setReach        = flExact | flReach
	setAccrue       = flExact | flAccrue
	setAccrueLedger = flExact | flAccrue | flLogged
	setAccrueReach  = flExact | flAccrue | flReach
	setSlope        = flSlope
	setAlone        = flAlone
	setAccrueAlone  = flAccrue | flAlone
)

// compiledSets are the sets above, each of which compiled gives its own
// walk (its tests walk each).
var compiledSets = [...]uint16{setExact, setLedger, setReach, setAccrue, setAccrueLedger, setAccrueReach, setSlope, setAlone, setAccrueAlone}

// A flagSet is a set of flags as a type, which walk is compiled for:
// [1+b]byte is the set of bits b, whose flags are then constants to the
// compiler, so that what they rule out is not in that walk's code; [0]byte
// is no set, each flag read from walk's argument as it runs. The compiler
// compiles walk's one source once for each type here (a body for each
// shape of a type parameter): walk specialised by the compiler, not a
// second copy of it in the source.
type flagSet interface {
	~[0]byte | ~[1 + setExact]byte | ~[1 + setLedger]byte | ~[1 + setReach]byte |
		~[1 + setAccrue]byte | ~[1 + setAccrueLedger]byte | ~[1 + setAccrueReach]byte |
		~[1 + setSlope]byte | ~[1 + setAlone]byte | ~[1 + setAccrueAlone]byte
}

// fixed returns the flag bit of set F when F is a set of flags, else dyn,
// the flag's value at run time: a constant in each walk compiled for a
// set.
func fixed[F flagSet](dyn bool, bit uint16) bool {
	var z F
	if n := len(z); n != 0 {
		return uint16(n-1)&bit != 0
	}
	return dyn
}

// compiled walks s with walk compiled for flags f: for a set above, the
// one with its flags constants; else the one that reads them as it goes.
// Each call is direct, so that the walk's arguments stay where the caller
// put them.
func compiled(s *Schedule, in *Inputs, o *Options, f flags) Result {
	switch f.bits() {
	case setExact:
		return walk[[1 + setExact]byte](s, in, o, f)
	case setLedger:
		return walk[[1 + setLedger]byte](s, in, o, f)
	case setReach:
		return walk[[1 + setReach]byte](s, in, o, f)
	case setAccrue:
		return walk[[1 + setAccrue]byte](s, in, o, f)
	case setAccrueLedger:
		return walk[[1 + setAccrueLedger]byte](s, in, o, f)
	case setAccrueReach:
		return walk[[1 + setAccrueReach]byte](s, in, o, f)
	case setSlope:
		return walk[[1 + setSlope]byte](s, in, o, f)
	case setAlone:
		return walk[[1 + setAlone]byte](s, in, o, f)
	case setAccrueAlone:
		return walk[[1 + setAccrueAlone]byte](s, in, o, f)
	}
	slowWalks.Add(1)
	return walk[[0]byte](s, in, o, f)
}

// slowWalks counts the walks made by the walk that reads its flags as it
// goes (see [SlowWalks]).
var slowWalks atomic.Int64

// SlowWalks returns how many walks since the process started were not of
// a set of flags compiled for: a count the tests hold at zero for the walks
// the commands make most, so that a flag added or a set changed does not
// quietly leave them on the slower walk.
func SlowWalks() int64 { return slowWalks.Load() }
