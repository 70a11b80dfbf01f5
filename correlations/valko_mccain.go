package correlations

import "math"

// Valkó and McCain (2003): P.P. Valkó and W.D. McCain Jr., "Reservoir Oil Bubblepoint Pressures
// Revisited; Solution Gas–Oil Ratios and Surface Gas Specific Gravities", J. Pet. Sci. Eng. 37
// (2003) 153–169. Fitted to 1,745 bubble points from around the world: Pb 32–6,700 psia,
// T 74–342 °F, Rsb 10–2,216 scf/STB, 6.0–63.7 °API, separator γg 0.555–1.685 (from memory).
//
//	ln Pb = 7.475 + 0.713·z + 0.0075·z²,  z = Σ zn,  zn = C0n + C1n·Vn + C2n·Vn² + C3n·Vn³,
//
// V1 = ln Rsb, V2 = API, V3 = γg (separator gas), V4 = T (°F).

var vmC = [4][4]float64{
	{-5.48, -0.0378, 0.281, -0.0206},      // ln Rsb
	{1.27, -0.0449, 4.36e-4, -4.76e-6},    // API
	{4.51, -10.84, 8.39, -2.34},           // γg
	{-0.7835, 6.23e-3, -1.22e-5, 1.03e-8}, // T °F
}

func vmTerm(c *[4]float64, v float64) float64 { return c[0] + v*(c[1]+v*(c[2]+v*c[3])) }

// vmX1, vmX2 bound the interval of x = ln Rsb on which z1 rises (the roots of dz1/dx). Outside
// it the cubic turns over: the published Pb is not monotonic in Rsb below about 1.07 scf/STB
// or above about 8,300 scf/STB.
var vmX1, vmX2 = func() (float64, float64) {
	c := &vmC[0]
	// dz1/dx = c1 + 2·c2·x + 3·c3·x²
	a, b, cc := 3*c[3], 2*c[2], c[1]
	s := math.Sqrt(b*b - 4*a*cc)
	r1, r2 := (-b+s)/(2*a), (-b-s)/(2*a)
	return math.Min(r1, r2), math.Max(r1, r2)
}()

// vmRest returns z2 + z3 + z4, the part of z that does not depend on Rsb.
func vmRest(o Oil) float64 {
	return vmTerm(&vmC[1], o.API) + vmTerm(&vmC[2], o.separatorGasGravity()) + vmTerm(&vmC[3], o.Temperature)
}

func vmLnPb(z float64) float64 { return 7.475 + 0.713*z + 0.0075*z*z }

// ValkoMcCainBubblePoint returns the bubble-point pressure (psia), Valkó and McCain (2003),
// the published direction (see the file comment). Outside the interval where the cubic in
// ln Rsb rises (Rsb below about 1.07 or above about 8,300 scf/STB) the published Pb turns over;
// there Pb is continued in proportion to Rsb from the end point (Pb = Pb(Rs_end)·Rsb/Rs_end),
// so that the family is monotonic and total. For light oils with heavy gas the published Pb
// flattens well before its turning point (a few thousand psia), so higher pressures map to
// this continuation: such oils are far outside the data.
func ValkoMcCainBubblePoint(rsb float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	rest := vmRest(o)
	x := math.Log(rsb)
	switch {
	case x > vmX2:
		pbHi := math.Exp(vmLnPb(vmTerm(&vmC[0], vmX2) + rest))
		return finite(pbHi * rsb / math.Exp(vmX2))
	case x < vmX1:
		pbLo := math.Exp(vmLnPb(vmTerm(&vmC[0], vmX1) + rest))
		return finite(pbLo * rsb / math.Exp(vmX1))
	}
	return finite(math.Exp(vmLnPb(vmTerm(&vmC[0], x) + rest)))
}

// ValkoMcCainSolutionGOR returns the solution GOR (scf/STB) at p psia as the numerical inverse
// of ValkoMcCainBubblePoint, so that the pair is exactly consistent (the published companion,
// Velarde et al. 1997, needs Pb and Rsb and is not an inverse; see VelardeSolutionGOR). The
// quadratic in z is solved in closed form, then the cubic z1(ln Rs) by Brent's method on its
// rising interval (to 1e−13 in ln Rs); outside it, the proportional continuation of
// ValkoMcCainBubblePoint is inverted.
func ValkoMcCainSolutionGOR(p float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	// 0.0075·z² + 0.713·z + (7.475 − ln p) = 0, root on the rising branch (z > −47.5),
	// written without cancellation.
	cst := 7.475 - math.Log(p)
	disc := 0.713*0.713 - 4*0.0075*cst
	if disc < 0 {
		return 0, inputError("p", p, "a pressure the Valkó–McCain form can reach")
	}
	z := -2 * cst / (0.713 + math.Sqrt(disc))
	rest := vmRest(o)
	target := z - rest
	c := &vmC[0]
	lo, hi := vmTerm(c, vmX1), vmTerm(c, vmX2)
	switch {
	case target >= hi:
		pbHi := math.Exp(vmLnPb(hi + rest))
		return finite(math.Exp(vmX2) * p / pbHi)
	case target <= lo:
		pbLo := math.Exp(vmLnPb(lo + rest))
		return finite(math.Exp(vmX1) * p / pbLo)
	}
	x, err := brent(func(x float64) float64 { return vmTerm(c, x) - target }, vmX1, vmX2, 1e-13, 100)
	if err != nil {
		return 0, err
	}
	return finite(math.Exp(x))
}

// Velarde, Blasingame and McCain (1997): J. Velarde, T.A. Blasingame and W.D. McCain Jr.,
// "Correlation of Black Oil Properties at Pressures Below Bubble Point Pressure — A New
// Approach", paper 97-93, 48th Annual Technical Meeting of the Petroleum Society, Calgary
// (1997); J. Can. Pet. Tech. 38 (13) (1999). Fitted to 2,097 Rs values of 195 differential
// liberations.

var (
	velA = [5]float64{9.73e-7, 1.672608, 0.929870, 0.247235, 1.056052}
	velB = [5]float64{0.022339, -1.004750, 0.337711, 0.132795, 0.302065}
	velC = [5]float64{0.725167, -1.485480, -0.164741, -0.091330, 0.047094}
)

func velTerm(k *[5]float64, o Oil, pbg float64) float64 {
	return k[0] * pow(o.separatorGasGravity(), k[1]) * pow(o.API, k[2]) * pow(o.Temperature, k[3]) * pow(pbg, k[4])
}

// VelardeSolutionGOR returns the solution GOR (scf/STB) at p psia of an oil with bubble point
// pb (psia) and Rsb (scf/STB), Velarde, Blasingame and McCain (1997):
//
//	Rs/Rsb = a1·pr^a2 + (1 − a1)·pr^a3,  pr = (p − 14.7)/(pb − 14.7),
//	ai = Ai0 · γg^Ai1 · API^Ai2 · T^Ai3 · (pb − 14.7)^Ai4,
//
// T °F, γg the separator gas gravity. It gives the shape of Rs below a known bubble point and
// is not the inverse of any Pb correlation: p ≥ pb returns Rsb, p ≤ 14.7 psia returns 0.
func VelardeSolutionGOR(p, pb, rsb float64, o Oil) (float64, error) {
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if !(pb > 14.7) || math.IsInf(pb, 0) {
		return 0, inputError("Pb", pb, "a finite pressure > 14.7 psia")
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	switch {
	case p >= pb:
		return rsb, nil
	case p <= 14.7:
		return 0, nil
	}
	pbg := pb - 14.7 // the paper works in gauge pressures
	pr := (p - 14.7) / pbg
	a1 := velTerm(&velA, o, pbg)
	a2 := velTerm(&velB, o, pbg)
	a3 := velTerm(&velC, o, pbg)
	return finite(rsb * (a1*pow(pr, a2) + (1-a1)*pow(pr, a3)))
}

// The valko-mccain solution-gas family pairs the published Valkó–McCain (2003) bubble point
// with its published companion below Pb, the Velarde, Blasingame and McCain (1997) curve drawn
// through that bubble point: for an oil holding o.Rsb at its bubble point pb₀ = Pb_VM(o.Rsb),
//
//	Rs(p) = Rsb·[a1·pr^a2 + (1 − a1)·pr^a3],  pr = (p − 14.7)/(pb₀ − 14.7),
//
// continued by the same formula above pb₀ (hypothetical oils with more gas, for tables), and
// Pb(R) its numerical inverse (Brent), which is pb₀ at R = Rsb. The pair is an exact inverse
// wherever the curve rises (a2, a3 > 0 and 0 < a1 < 1, which holds across the correlation's
// data). Without the oil's Rsb (o.Rsb = 0) the pair falls back to the published Valkó–McCain Pb
// and its numerical inverse (ValkoMcCainSolutionGOR, 16–38 % below Velarde at half the bubble
// point): the survey of many oils uses Pb(Rsb) alone. Both correlations take the separator gas
// gravity (every stage ahead of the stock tank), as published.

// VelardeCoefficients are the constants of the valko-mccain pair that a refit may change: the
// leading factors of Velarde's a1, a2 and a3.
var VelardeCoefficients = []Coefficient{
	{ID: "a2_factor", Value: velB[0], Role: "0.022339, the factor of Velarde's exponent a2"},
	{ID: "a3_factor", Value: velC[0], Role: "0.725167, the factor of Velarde's exponent a3"},
	{ID: "a1_factor", Value: velA[0], Role: "9.73e−7, the factor of Velarde's weight a1"},
}

var velPublished = [3]float64{velB[0], velC[0], velA[0]}

// velardeCurve is Velarde's Rs through (pb, rsb) with the leading factors c (a2, a3, a1), not
// limited to Rsb above pb.
func velardeCurve(p, pb, rsb float64, o Oil, c []float64) float64 {
	if p <= 14.7 {
		return 0
	}
	pbg := pb - 14.7
	pr := (p - 14.7) / pbg
	ka, kb, kc := velA, velB, velC
	kb[0], kc[0], ka[0] = c[0], c[1], c[2]
	a1 := velTerm(&ka, o, pbg)
	a2 := velTerm(&kb, o, pbg)
	a3 := velTerm(&kc, o, pbg)
	return rsb * (a1*pow(pr, a2) + (1-a1)*pow(pr, a3))
}

// ValkoMcCainPairSolutionGOR returns the solution GOR (scf/STB) at p psia of the valko-mccain
// family (see above); o.Rsb is required.
func ValkoMcCainPairSolutionGOR(p float64, o Oil) (float64, error) {
	return ValkoMcCainPairSolutionGORWith(p, o, velPublished[:])
}

// ValkoMcCainPairSolutionGORWith is ValkoMcCainPairSolutionGOR with the coefficients c
// (VelardeCoefficients order).
func ValkoMcCainPairSolutionGORWith(p float64, o Oil, c []float64) (float64, error) {
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 3); err != nil {
		return 0, err
	}
	if o.Rsb <= 0 {
		return ValkoMcCainSolutionGOR(p, o)
	}
	pb0, err := ValkoMcCainBubblePoint(o.Rsb, o)
	if err != nil {
		return 0, err
	}
	if !(pb0 > 14.7) {
		return 0, inputError("Rsb", o.Rsb, "a bubble point above 14.7 psia for Velarde's curve")
	}
	return finite(velardeCurve(p, pb0, o.Rsb, o, c))
}

// ValkoMcCainPairBubblePoint returns the bubble point (psia) of an oil holding rs scf/STB on
// the valko-mccain family's curve (see above).
func ValkoMcCainPairBubblePoint(rs float64, o Oil) (float64, error) {
	return ValkoMcCainPairBubblePointWith(rs, o, velPublished[:])
}

// ValkoMcCainPairBubblePointWith is ValkoMcCainPairBubblePoint with the coefficients c
// (VelardeCoefficients order), the inverse of ValkoMcCainPairSolutionGORWith.
func ValkoMcCainPairBubblePointWith(rs float64, o Oil, c []float64) (float64, error) {
	if err := checkCoefficients(c, 3); err != nil {
		return 0, err
	}
	if o.Rsb <= 0 || rs == o.Rsb {
		return ValkoMcCainBubblePoint(rs, o)
	}
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	if rs == 0 {
		return 14.7, nil
	}
	pb0, err := ValkoMcCainBubblePoint(o.Rsb, o)
	if err != nil {
		return 0, err
	}
	if !(pb0 > 14.7) {
		return 0, inputError("Rsb", o.Rsb, "a bubble point above 14.7 psia for Velarde's curve")
	}
	g := func(p float64) float64 { return velardeCurve(p, pb0, o.Rsb, o, c) - rs }
	hi := pb0
	for i := 0; g(hi) < 0; i++ {
		if i > 60 || math.IsInf(hi, 0) {
			return 0, inputError("Rs", rs, "a solution GOR that Velarde's curve reaches")
		}
		hi *= 2
	}
	p, err := brent(g, 14.7, hi, 1e-12*pb0, 200)
	if err != nil {
		return 0, err
	}
	return finite(p)
}
