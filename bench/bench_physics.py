"""Time the physics chain for one event's samples (10^4 and 10^5): prints ms per event.

Run: ``python bench/bench_physics.py``. The chain is what ``derive`` runs per event: redshift from
distance, source frame, chirp mass, both remnant-spin fits, both radiated-energy fits, peak
luminosity, kick, ringdown (Leaver table) and time in band. The first call per cosmology builds
the distance table; it is timed separately.
"""

from __future__ import annotations

import time

import astropy.units as u
import numpy as np
from astropy.cosmology import Planck18

from factsheet.physics import cosmology, inspiral, kick, luminosity, remnant, ringdown


def samples(n: int, rng: np.random.Generator) -> dict[str, np.ndarray]:
    """Invented detector-frame samples of one binary-black-hole event."""
    return {
        "m1": rng.normal(36, 4, n).clip(5) * u.Msun,
        "m2": rng.normal(29, 4, n).clip(3) * u.Msun,
        "chi1": rng.uniform(-0.5, 0.9, n),
        "chi2": rng.uniform(-0.5, 0.9, n),
        "distance": rng.normal(450, 120, n).clip(20) * u.Mpc,
    }


def chain(s: dict[str, np.ndarray]) -> dict[str, object]:
    """Every derived quantity for one event's samples."""
    z = cosmology.redshift_at_distance(s["distance"], Planck18)
    m1, m2 = cosmology.to_source_frame(s["m1"], z), cosmology.to_source_frame(s["m2"], z)
    args = (m1, m2, s["chi1"], s["chi2"])
    spins = [remnant.remnant_spin_jf17(*args), remnant.remnant_spin_hbr16(*args)]
    e_rad = [remnant.radiated_fraction_jf17(*args), remnant.radiated_fraction_bmr12(*args)]
    remnant_mass = (m1 + m2) * (1 - np.mean(e_rad, axis=0))
    f_ring, tau_ring = ringdown.qnm_220(
        cosmology.to_detector_frame(remnant_mass, z), np.mean(spins, 0)
    )
    return {
        "chirp": inspiral.chirp_mass(s["m1"], s["m2"]),
        "lum": luminosity.peak_luminosity_keitel17(*args),
        "kick": kick.kick_velocity(*args),
        "ring": (f_ring, tau_ring),
        "band": inspiral.time_to_merger(inspiral.chirp_mass(s["m1"], s["m2"]), 20 * u.Hz),
    }


def best_of(func, repeats: int = 7) -> float:
    """Smallest wall time of ``repeats`` calls, in ms."""
    times = []
    for _ in range(repeats):
        start = time.perf_counter()
        func()
        times.append(time.perf_counter() - start)
    return 1e3 * min(times)


def main() -> None:
    rng = np.random.default_rng(2034)
    start = time.perf_counter()
    cosmology.redshift_at_distance(100 * u.Mpc, Planck18)
    print(
        f"first distance table (once per cosmology): {1e3 * (time.perf_counter() - start):.1f} ms"
    )
    for n in (10**4, 10**5):
        s = samples(n, rng)
        print(f"{n:>7} samples: {best_of(lambda s=s: chain(s)):.1f} ms per event (best of 7)")


if __name__ == "__main__":
    main()
