package calc

// Branch names the branch of the efficiency-of-blow formula used.
type Branch string

// The two branches of the efficiency of blow.
const (
	HeavyRam Branch = "W ≥ eP" // ram at least e times the struck weight
	LightRam Branch = "W < eP"
)

// EfficiencyOfBlow is η, the part of the ram's energy after impact that
// goes into the pile, for a ram of weight W striking a pile (with helmet,
// dolly, packing and anvil) of weight P with coefficient of restitution e.
// Any consistent units; only the ratio P/W matters.
//
//	W ≥ e·P:  η = (W + e²·P) / (W + P)
//	W < e·P:  η = (W + e²·P) / (W + P) − ((W − e·P) / (W + P))²
//
// The first is Venkatramaiah, Geotechnical Engineering [C]; the second is
// Tomlinson and Whitaker [M]. The branches meet at W = e·P, where the
// correction term is zero. W must be positive and P not negative, with
// 0 ≤ e ≤ 1; outside that the result is meaningless (Resolve prevents it).
func EfficiencyOfBlow(w, p, e float64) (eta float64, branch Branch) {
	eta = (w + e*e*p) / (w + p)
	if w >= e*p {
		return eta, HeavyRam
	}
	d := (w - e*p) / (w + p)
	return eta - d*d, LightRam
}
