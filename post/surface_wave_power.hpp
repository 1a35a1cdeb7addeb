#pragma once
/// The power a printed antenna launches into the surface waves of its substrate.
#include "solver/antenna_problem.hpp"

namespace lobe {

/// ½ Re I^H Z_sw I, where Z_sw is the fill with each surface-wave pole's power-carrying part
/// −(j kp Res/2) J0(kp ρ) as kernel (the Y0 part is reactive). With J0(kp|ρ − ρ'|) =
/// (1/2π) ∮ e^{j kp α̂·(ρ − ρ')} dα and ∇·J ↔ j kp α̂·J̃ it is, per pole,
///   ½ Re[(ωμ0 kp Res_A/2) ⟨|J̃|²⟩ − (kp³ Res_V/(2ωε0)) ⟨|α̂·J̃|²⟩],
/// ⟨·⟩ the mean over the azimuth α and J̃(α) = ∫ J e^{−j kp α̂·ρ} dS. Probes add, with their
/// currents' transform V(α) = Σ I_p e^{−j kp α̂·ρ_p} and the residues R_Φ, R_W of their
/// kernels with the charge at the probe's top counted (solver/probe_kernels.hpp),
/// ½ Re[−(j kp R_Φ/2) ⟨2 Re(Q* V)⟩ − (j kp R_W/2) ⟨|V|²⟩], Q = j kp α̂·J̃ the transform of
/// ∇·J (the stars' unit sources at their vertices included). W; zero off a
/// substrate. On a lossy board the waves decay as they travel; this is the power they carry
/// away from the antenna's own region.
Real surface_wave_power(const AntennaProblem& problem, const FrequencySolution& solution);

}  // namespace lobe
