package panels

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
)

// Planarization defaults.
const (
	// DefaultFlatTolMM is the flatness deviation every panel must reach.
	DefaultFlatTolMM = 0.5
	// DefaultMaxMoveMM is the largest node move allowed.
	DefaultMaxMoveMM = 25.0
	// DefaultFairness weighs smooth moves against small moves.
	DefaultFairness = 1.0
	// DefaultMaxIter is the iteration budget (Gauss-Newton steps).
	DefaultMaxIter = 200
)

// NoFairness, given as PlanarizeOptions.Fairness, turns fairness off (the
// field's zero value means DefaultFairness).
const NoFairness = -1.0

// PlanarizeOptions sets up a planarization. A zero field means its
// default, so PlanarizeOptions{TolMM: 0.3} is the defaults with a finer
// tolerance; where zero is a setting of its own, a negative constant asks
// for it (NoFairness).
type PlanarizeOptions struct {
	TolMM     float64 // flatness deviation to reach (mm), > 0; 0: DefaultFlatTolMM
	MaxMoveMM float64 // largest node move allowed (mm), > 0; 0: DefaultMaxMoveMM
	// Fairness weighs the smoothness of the moves: the squared umbrella
	// Laplacian of the move field against the squared moves. 0:
	// DefaultFairness; NoFairness turns it off.
	Fairness float64
	// Fixed marks nodes that never move (supports). Nil: none.
	Fixed []bool
	// Vertical keeps every node on its vertical line: only z moves.
	Vertical bool
	MaxIter  int // iteration budget, > 0; 0: DefaultMaxIter
	// Progress, if set, is called after every iteration.
	Progress func(Progress)
}

// Largest values accepted: beyond them a setting is a unit mistake.
const (
	MaxFlatTolMM = 1000.0
	MaxMoveMM    = 1e5
	MaxFairness  = 1e6
	MaxIter      = 100000
)

// withDefaults returns the options to compute with: every zero field set
// to its default, and NoFairness to a fairness of 0. Its zeros mean zero,
// so its result goes only to unexported code, never back to Planarize.
func (o PlanarizeOptions) withDefaults() PlanarizeOptions {
	if o.TolMM == 0 {
		o.TolMM = DefaultFlatTolMM
	}
	if o.MaxMoveMM == 0 {
		o.MaxMoveMM = DefaultMaxMoveMM
	}
	switch o.Fairness {
	case 0:
		o.Fairness = DefaultFairness
	case NoFairness:
		o.Fairness = 0
	}
	if o.MaxIter == 0 {
		o.MaxIter = DefaultMaxIter
	}
	return o
}

// Validate checks every option's range, a zero field standing for its
// default, and returns a *geom.FieldError naming the first bad field.
func (o PlanarizeOptions) Validate() error { return o.withDefaults().check() }

// ValidateExact checks the options as given: a zero field means zero (an
// error where the option has no zero setting) and the negative constants
// are refused, as a job file or a flag means them. The errors are
// Validate's.
func (o PlanarizeOptions) ValidateExact() error { return o.check() }

// check checks the ranges of the fields as they stand.
func (o PlanarizeOptions) check() error {
	switch {
	case !(o.TolMM > 0) || o.TolMM > MaxFlatTolMM:
		return geom.FieldErrorf("TolMM", "%g must be more than 0 and at most %g mm", o.TolMM, MaxFlatTolMM)
	case !(o.MaxMoveMM > 0) || o.MaxMoveMM > MaxMoveMM:
		return geom.FieldErrorf("MaxMoveMM", "%g must be more than 0 and at most %g mm", o.MaxMoveMM, MaxMoveMM)
	case !(o.Fairness >= 0) || o.Fairness > MaxFairness:
		return geom.FieldErrorf("Fairness", "%g must be between 0 and %g", o.Fairness, MaxFairness)
	case o.MaxIter <= 0 || o.MaxIter > MaxIter:
		return geom.FieldErrorf("MaxIter", "%d must be between 1 and %d", o.MaxIter, MaxIter)
	}
	return nil
}

// DefaultPlanarizeOptions returns the job defaults, every field set: the
// zero PlanarizeOptions does the same work.
func DefaultPlanarizeOptions() PlanarizeOptions {
	return PlanarizeOptions{TolMM: DefaultFlatTolMM, MaxMoveMM: DefaultMaxMoveMM, Fairness: DefaultFairness, MaxIter: DefaultMaxIter}
}

// Progress is reported after each iteration.
type Progress struct {
	Iter        int
	MaxIter     int
	MaxFlatMM   float64 // worst flatness deviation now
	OverTol     int     // panels still over the tolerance
	ExcessMM    float64 // total flatness deviation over the tolerance (mm)
	MaxMoveMM   float64 // largest node move so far
	Description string
}

// PlanarizeResult is the outcome of a planarization.
type PlanarizeResult struct {
	Positions  []geom.Vec // new node positions
	Moves      []geom.Vec // per node move (new - old)
	MaxMoveMM  float64
	RMSMoveMM  float64
	Before     []float64 // flatness deviation per panel before (mm)
	After      []float64 // and after
	Iterations int
	Converged  bool // every panel within tolerance and no move over the limit
	// Stop names the limit that stopped a planarization short of the
	// tolerance; StopNone when it converged.
	Stop Stop
	// NeedMoveMM is, when the allowed move stopped it, the largest node
	// move of a run without that limit that reached the tolerance (0 when
	// that run did not reach it either).
	NeedMoveMM float64
}

// PanelFailure names a panel that could not be made flat enough.
type PanelFailure struct {
	Face       int
	InputMM    float64 // flatness deviation in the input
	FlatnessMM float64 // flatness deviation reached (the best state)
	// NeedMM is the least node move that makes the panel flat on its own:
	// its corners' distance from their least-squares plane, or from the
	// plane of its fixed corners when three or more are fixed. +Inf when
	// its fixed corners are not coplanar (no move can flatten it).
	NeedMM float64
	Fixed  int // corners that are supports
}

// Stop is why a planarization stopped short of the tolerance.
type Stop int

// The limits that stop a planarization.
const (
	StopNone      Stop = iota // it did not stop short: every panel is within the tolerance
	StopMoveLimit             // the allowed node move held it back
	StopBudget                // the iteration budget ran out
	StopSupports              // the supports hold every corner of the failing panels
	StopStalled               // the rounds made no further progress
)

// String names the limit in plain words.
func (s Stop) String() string {
	switch s {
	case StopNone:
		return "none"
	case StopMoveLimit:
		return "the allowed node move"
	case StopBudget:
		return "the iteration budget"
	case StopSupports:
		return "the supports"
	case StopStalled:
		return "no further progress"
	}
	return fmt.Sprintf("Stop(%d)", int(s))
}

// PlanarizeError reports a planarization that did not reach the tolerance
// within the allowed move or the iteration budget. The best state reached
// (never the input's worse) is returned beside it, and Worst names the
// panels still over the tolerance there.
type PlanarizeError struct {
	Source    string
	Stop      Stop           // which limit stopped it
	Worst     []PanelFailure // worst first, at most ten
	Count     int            // panels over the tolerance
	Names     []string       // panel names of Worst
	TolMM     float64
	MaxMoveMM float64
	MaxIter   int
	BestMM    float64 // largest flatness deviation reached
	InputMM   float64 // largest flatness deviation in the input
	// NeedMoveMM is the largest node move of a run without the move
	// limit that reached the tolerance, when the limit stopped this one
	// and that run succeeded; else 0.
	NeedMoveMM float64
}

func (e *PlanarizeError) Error() string {
	var b strings.Builder
	fmt.Fprintf(&b, "%s: planarization failed: %d panels stay over the %.3g mm flatness tolerance (at most %.3f mm, from %.3f mm in the input)",
		e.Source, e.Count, e.TolMM, e.BestMM, e.InputMM)
	switch e.Stop {
	case StopMoveLimit:
		fmt.Fprintf(&b, "; stopped by the allowed node move of %.3g mm", e.MaxMoveMM)
		if e.NeedMoveMM > 0 {
			fmt.Fprintf(&b, " (without that limit every panel comes within the tolerance with a largest node move of %.1f mm)", e.NeedMoveMM)
		}
	case StopBudget:
		fmt.Fprintf(&b, "; stopped by the iteration budget of %d steps", e.MaxIter)
	case StopSupports:
		b.WriteString("; stopped by the supports, which hold the corners of these panels")
	default:
		b.WriteString("; stopped making progress")
	}
	if len(e.Worst) > 0 {
		b.WriteString("; worst:")
		for i, w := range e.Worst {
			if i > 0 {
				b.WriteString(",")
			}
			need := "cannot be flattened: its fixed corners are not in one plane"
			if !math.IsInf(w.NeedMM, 1) {
				need = fmt.Sprintf("needs a move of at least %.2f mm", w.NeedMM)
			}
			fmt.Fprintf(&b, " %s %.3f mm off flat (input %.3f mm; %s)", e.Names[i], w.FlatnessMM, w.InputMM, need)
		}
	}
	return b.String()
}

// Planarize moves the free nodes of n as little and as smoothly as it can
// so that every panel's flatness deviation is within opt.TolMM.
//
// Method: the augmented Lagrangian method (method of multipliers,
// Hestenes 1969, Powell 1969) with a rising penalty, on
//
//	E(x) = Σ_c w (g_c(x) + s_c)² + |x − x⁰|² + λ |L(x − x⁰)|²
//
// where g_c is the signed diagonal gap of each run of four consecutive
// corners of a panel (for a quad, the one pair of diagonals; Liu et al.
// 2006), L the umbrella Laplacian over the net's edges, λ the fairness
// and s_c the multiplier shift of each gap. Each round minimises E by
// Levenberg-Marquardt steps (Gauss-Newton damped by the diagonal); each
// step solves the sparse symmetric positive definite normal equations by
// Jacobi-preconditioned conjugate gradients, matrix-free, so memory and
// time per step are linear in the net's size. Between rounds each shift
// grows by its gap (the multiplier update) and, where the gaps did not
// shrink to a quarter, the weight w rises tenfold (a continuation: the
// answer follows the smallest, smoothest move as the panels come flat).
// Progress is judged on the total flatness excess over the tolerance, not
// only on the worst panel, and the state handed back is never worse than
// the input in its largest flatness deviation or its count of panels over
// the tolerance.
//
// It returns the result and, when the tolerance or the move limit is not
// met, a *PlanarizeError beside it. When the allowed move stopped it, a
// second run without the limit says how large a move the tolerance needs
// (PlanarizeError.NeedMoveMM). A zero field of opt means its default.
func Planarize(n *quadnet.Net, topo *quadnet.Topology, opt PlanarizeOptions) (*PlanarizeResult, error) {
	if err := opt.Validate(); err != nil {
		return nil, err
	}
	opt = opt.withDefaults()
	if opt.Fixed != nil && len(opt.Fixed) != len(n.Nodes) {
		return nil, geom.FieldErrorf("Fixed", "has %d entries for %d nodes", len(opt.Fixed), len(n.Nodes))
	}
	s := newSolver(n, topo, opt)
	res := &PlanarizeResult{Before: s.flatness(s.x0)}
	x, iter := s.run(res.Before, opt)
	res = s.result(n, x, res.Before, iter, opt.TolMM)
	if res.Converged {
		return res, nil
	}
	pe := failure(n, res, opt, iter, s.clamped)
	if pe.Stop == StopMoveLimit && opt.MaxMoveMM < MaxMoveMM {
		// How large a move would do: the same run without the limit.
		free := opt
		free.MaxMoveMM, free.Progress = MaxMoveMM, nil
		fs := newSolver(n, topo, free)
		fx, fiter := fs.run(res.Before, free)
		if countOver(fs.flatness(fx), opt.TolMM) == 0 {
			pe.NeedMoveMM = fs.maxMove(fx)
			if pe.NeedMoveMM <= opt.MaxMoveMM {
				// The limit bent this run's path without binding the
				// answer: the run without it stays within the limit.
				return s.result(n, fx, res.Before, res.Iterations+fiter, opt.TolMM), nil
			}
		}
	}
	res.Stop, res.NeedMoveMM = pe.Stop, pe.NeedMoveMM
	return res, pe
}

// result turns positions x into a PlanarizeResult.
func (s *solver) result(n *quadnet.Net, x, before []float64, iter int, tol float64) *PlanarizeResult {
	res := &PlanarizeResult{Before: before, Iterations: iter}
	res.Positions = make([]geom.Vec, len(n.Nodes))
	res.Moves = make([]geom.Vec, len(n.Nodes))
	var sum float64
	for i := range n.Nodes {
		res.Positions[i] = geom.Vec{X: x[3*i], Y: x[3*i+1], Z: x[3*i+2]}
		res.Moves[i] = r3.Sub(res.Positions[i], n.Nodes[i].Pos)
		m := r3.Norm(res.Moves[i])
		sum += m * m
		res.MaxMoveMM = math.Max(res.MaxMoveMM, m)
	}
	if len(n.Nodes) > 0 {
		res.RMSMoveMM = math.Sqrt(sum / float64(len(n.Nodes)))
	}
	res.After = s.flatness(x)
	res.Converged = countOver(res.After, tol) == 0
	return res
}

// state is one iterate's standing: panels over the tolerance, their total
// excess over it and the largest flatness deviation.
type state struct {
	over        int
	excess, max float64
}

func standing(flat []float64, tol float64) state {
	st := state{over: countOver(flat, tol), max: maxOf(flat)}
	for _, f := range flat {
		st.excess += math.Max(0, f-tol)
	}
	return st
}

// run drives the rounds of the augmented Lagrangian method from the input
// positions and returns the best state reached and the steps taken. The
// best state is the one with the fewest panels over the tolerance, then
// the least total excess, among the states no worse than the input in
// both its count over the tolerance and its largest deviation.
func (s *solver) run(before []float64, opt PlanarizeOptions) ([]float64, int) {
	x := append([]float64(nil), s.x0...)
	input := standing(before, opt.TolMM)
	bestX, best := x, input
	iter := 0
	report := func(st state) {
		if opt.Progress != nil {
			opt.Progress(Progress{Iter: iter, MaxIter: opt.MaxIter, MaxFlatMM: st.max, OverTol: st.over,
				ExcessMM: st.excess, MaxMoveMM: s.maxMove(x), Description: "planarize"})
		}
	}
	report(input)
	if input.over == 0 {
		return x, 0
	}
	s.linearize(x)
	viol := s.violation()
	roundBest, stale := input.excess, 0
	for iter < opt.MaxIter {
		// One round: Levenberg-Marquardt at fixed weight and shifts, the
		// damping steered by the gain ratio (Nielsen 1999).
		energy := s.energy(x)
		mu, nu := initialDamping, 2.0
		for steps := 0; iter < opt.MaxIter && steps < roundSteps; steps++ {
			iter++
			s.linearize(x)
			grad := s.gradient(x)
			step := s.solve(grad, mu)
			trial := make([]float64, len(x))
			// The model's decrease of E: 2gᵀs − sᵀHs = gᵀs + μ sᵀDs.
			var pred float64
			for i := range x {
				trial[i] = x[i] - step[i]
				pred += grad[i]*step[i] + mu*s.diag[i]*step[i]*step[i]
			}
			s.clamp(trial, opt.MaxMoveMM)
			e := s.energy(trial)
			if !(e < energy) || !(pred > 0) {
				mu *= nu
				nu *= 2
				report(best)
				if mu > maxDamping {
					break
				}
				continue
			}
			decrease := (energy - e) / energy
			rho := (energy - e) / pred
			mu = math.Max(mu*math.Max(1.0/3, 1-math.Pow(2*rho-1, 3)), minDamping)
			nu = 2
			x, energy = trial, e
			st := standing(s.flatness(x), opt.TolMM)
			if st.over <= input.over && st.max <= input.max &&
				(st.over < best.over || (st.over == best.over && st.excess < best.excess)) {
				bestX, best = x, st
			}
			report(st)
			if st.over == 0 {
				return x, iter
			}
			if decrease < gnConverged {
				break
			}
		}
		// Between rounds: progress on the total excess, then the
		// multiplier update once the gaps are within a few tolerances
		// (earlier, on a net far from flat, the multipliers' estimates
		// lead to a worse answer: Conn, Gould and Toint 1991 update them
		// only below a shrinking violation) and, where the gaps are still
		// wide or shrank too little, a heavier weight.
		if best.excess < (1-roundGain)*roundBest {
			roundBest, stale = best.excess, 0
		} else if stale++; stale >= stallRounds {
			break
		}
		s.linearize(x)
		v := s.violation()
		if v <= shiftGate*opt.TolMM {
			for k := range s.cons {
				s.cons[k].shift += s.cons[k].val
			}
		}
		if v > shiftGate*opt.TolMM || v > violationShrink*viol {
			if s.w*weightRise > maxGapWeight {
				break
			}
			s.setWeight(s.w * weightRise)
		}
		viol = v
	}
	return bestX, iter
}

// failure explains a planarization that stopped short: which limit
// stopped it (the allowed move when any step was held back by it), and the panels still over the tolerance with the move each
// needs.
func failure(n *quadnet.Net, res *PlanarizeResult, opt PlanarizeOptions, iter int, clamped bool) *PlanarizeError {
	pe := &PlanarizeError{Source: n.Source, Count: countOver(res.After, opt.TolMM), TolMM: opt.TolMM, MaxMoveMM: opt.MaxMoveMM,
		MaxIter: opt.MaxIter, BestMM: maxOf(res.After), InputMM: maxOf(res.Before)}
	var fails []PanelFailure
	atLimit, allFixed := false, true
	var pts []geom.Vec
	for f, face := range n.Faces {
		if res.After[f] <= opt.TolMM {
			continue
		}
		pts = n.FacePoints(pts[:0], f)
		pf := PanelFailure{Face: f, InputMM: res.Before[f], FlatnessMM: res.After[f]}
		var fixed []geom.Vec
		for _, c := range face.Corners {
			if opt.Fixed != nil && opt.Fixed[c] {
				fixed = append(fixed, n.Nodes[c].Pos)
			} else if r3.Norm(res.Moves[c]) >= atLimitShare*opt.MaxMoveMM {
				atLimit = true
			}
		}
		pf.Fixed = len(fixed)
		pf.NeedMM = needMove(pts, fixed)
		if pf.Fixed < len(face.Corners) {
			allFixed = false
		}
		fails = append(fails, pf)
	}
	switch {
	case atLimit || clamped || anyNeedsMore(fails, opt.MaxMoveMM):
		pe.Stop = StopMoveLimit
	case iter >= opt.MaxIter:
		pe.Stop = StopBudget
	case allFixed:
		pe.Stop = StopSupports
	default:
		pe.Stop = StopStalled
	}
	sort.SliceStable(fails, func(i, j int) bool { return fails[i].FlatnessMM > fails[j].FlatnessMM })
	if len(fails) > 10 {
		fails = fails[:10]
	}
	pe.Worst = fails
	for _, f := range fails {
		pe.Names = append(pe.Names, n.FaceName(f.Face))
	}
	return pe
}

// atLimitShare: a node moved this share of the allowed move or more counts
// as held back by the limit.
const atLimitShare = 0.999

// anyNeedsMore reports whether a failing panel needs more than the
// allowed move on its own.
func anyNeedsMore(fails []PanelFailure, maxMove float64) bool {
	for _, f := range fails {
		if f.NeedMM > maxMove && !math.IsInf(f.NeedMM, 1) {
			return true
		}
	}
	return false
}

// needMove returns the least node move that makes a panel with corners
// pts flat on its own (see PanelFailure.NeedMM); fixed lists the corners
// that are supports.
func needMove(pts, fixed []geom.Vec) float64 {
	if len(fixed) < 3 {
		fit, err := geom.FitPlane(pts)
		if err != nil {
			return math.Inf(1)
		}
		return fit.MaxDist
	}
	fit, err := geom.FitPlane(fixed)
	if err != nil || fit.MaxDist > fixedPlaneTolMM {
		return math.Inf(1)
	}
	var m float64
	for _, p := range pts {
		m = math.Max(m, math.Abs(fit.Dist(p)))
	}
	return m
}

// fixedPlaneTolMM: fixed corners this close to one plane count as coplanar.
const fixedPlaneTolMM = 1e-6

func countOver(flat []float64, tol float64) int {
	c := 0
	for _, f := range flat {
		if f > tol {
			c++
		}
	}
	return c
}

func maxOf(xs []float64) float64 {
	m := 0.0
	for _, x := range xs {
		m = math.Max(m, x)
	}
	return m
}
