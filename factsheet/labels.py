"""Every label a reader sees for a quantity, a mass band or edge, a subject or a window: one table.

The sheet's tables, its figures and their alt text, the history list, the changes page, the
feed, the exports' column descriptions and the caveats all take their words from here, so one
quantity is named the same way everywhere. Keys are the JSON export's (``heavier_mass``, ...)
and the reference data's (``lower_gap``, ``kilonova_blue``, ...).
"""

from __future__ import annotations

from dataclasses import dataclass

from factsheet.model import DETECTOR


@dataclass(frozen=True)
class QuantityLabel:
    """How one quantity is named: in full (tables, exports), short (figures, lists), in prose."""

    name: str
    short: str
    group: str  # the part of the sheet it belongs to: a key of GROUPS
    prose: str = ""  # inside a sentence; the name with a lower-case first letter when empty

    @property
    def in_prose(self) -> str:
        return self.prose or self.name[0].lower() + self.name[1:]


Q = QuantityLabel
#: Quantities in the order a sheet lists them, each in the group of the sheet it belongs to.
QUANTITIES: dict[str, QuantityLabel] = {
    "heavier_mass": Q("Mass of the heavier body m₁", "m₁", "bodies", "the heavier body's mass"),
    "lighter_mass": Q("Mass of the lighter body m₂", "m₂", "bodies", "the lighter body's mass"),
    "heavier_mass_detector": Q(
        "Mass of the heavier body (detector frame)", "m₁ (detector frame)", "bodies"
    ),
    "lighter_mass_detector": Q(
        "Mass of the lighter body (detector frame)", "m₂ (detector frame)", "bodies"
    ),
    "total_mass": Q("Total mass", "Total mass", "bodies"),
    "total_mass_detector": Q(
        "Total mass (detector frame)", "Total mass (detector frame)", "bodies"
    ),
    "chirp_mass": Q("Chirp mass", "Chirp mass", "bodies"),
    "chirp_mass_detector": Q(
        "Chirp mass (detector frame)", "Chirp mass (detector frame)", "bodies"
    ),
    "mass_ratio": Q("Mass ratio q = m₂/m₁", "q", "bodies", "the mass ratio"),
    "heavier_spin": Q(
        "Aligned spin of the heavier body χ₁", "χ₁", "bodies", "the heavier body's spin"
    ),
    "lighter_spin": Q(
        "Aligned spin of the lighter body χ₂", "χ₂", "bodies", "the lighter body's spin"
    ),
    "heavier_spin_magnitude": Q(
        "Spin magnitude of the heavier body a₁", "a₁", "bodies", "the heavier body's spin magnitude"
    ),
    "heavier_tilt": Q(
        "Spin tilt of the heavier body θ₁ (to the orbit's axis)",
        "θ₁",
        "bodies",
        "the heavier body's spin tilt",
    ),
    "lighter_spin_magnitude": Q(
        "Spin magnitude of the lighter body a₂", "a₂", "bodies", "the lighter body's spin magnitude"
    ),
    "lighter_tilt": Q(
        "Spin tilt of the lighter body θ₂ (to the orbit's axis)",
        "θ₂",
        "bodies",
        "the lighter body's spin tilt",
    ),
    "effective_spin": Q("Effective spin χ_eff", "χ_eff", "bodies", "the effective spin"),
    "precession_spin": Q(
        "Effective precession spin χ_p", "χ_p", "bodies", "the effective precession spin"
    ),
    "remnant_mass": Q("Remnant mass", "Remnant mass", "remnant"),
    "remnant_spin": Q("Remnant spin", "Remnant spin", "remnant"),
    "radiated_mass": Q("Mass-energy radiated", "Mass-energy radiated", "remnant"),
    "energy_radiated": Q("Energy radiated", "Energy radiated", "remnant"),
    "peak_luminosity": Q("Peak luminosity", "Peak luminosity", "remnant"),
    "kick_velocity": Q("Recoil kick", "Recoil kick", "remnant", "the recoil kick"),
    "ringdown_frequency": Q("Ringdown frequency (observed)", "Ringdown", "signal"),
    "ringdown_damping_time": Q("Ringdown damping time (observed)", "Damping time", "signal"),
    "isco_frequency": Q(
        "ISCO frequency, end of inspiral (observed)", "ISCO", "signal", "the ISCO frequency"
    ),
    "time_in_band": Q("Time in band (leading order)", "Time in band", "signal"),
    "cycles_in_band": Q("Cycles in band (leading order)", "Cycles in band", "signal"),
    "strain_amplitude": Q(
        "Peak strain, optimally oriented (leading order)", "Peak strain", "signal"
    ),
    "arm_length_change": Q(
        "Arm-length change per arm (leading order)", "Arm-length change", "signal"
    ),
    "distance": Q("Luminosity distance", "Distance", "where", "the luminosity distance"),
    "redshift": Q("Redshift z", "z", "where", "the redshift"),
    "lookback_time": Q(
        "Time since the merger (lookback time)", "Lookback time", "where", "the lookback time"
    ),
}
del Q

#: The groups of a sheet's numbers, in page order: each answers one question a reader has.
GROUPS = {
    "bodies": "The two bodies",
    "remnant": "What they became",
    "signal": "The signal in the detectors",
    "where": "How far and how long ago",
}

#: How a number of a sheet came about, for the mark beside it.
KINDS = {
    "given": "measured",  # an input value, shown as given
    "fixed": "fixed in the analysis",  # an exact input value: assumed, not measured
    "samples": "measured",  # summarised from the samples file
    "derived": "derived",  # computed here from the inputs
}

#: Names in the figures for what is not a quantity of a sheet: axes, marks and the merger's rows.
FIGURE_NAMES = {
    "frequency": "Frequency",
    "time_before_merger": "Time before merger",
    "time_after_merger": "after",
    "band_edge": "band edge",
    "merger": "merger",
    "merger_energy": "this merger (gravitational waves)",
    "merger_peak": "this merger at its peak",
}

#: Parameters that fits are calibrated on but that are not quantities of a sheet.
PARAMETERS = {"compactness": "the neutron star's compactness", "spin": "the black hole's spin"}

#: The frame masses were given in, as a suffix of their labels in an estimate.
FRAME_SUFFIX = {DETECTOR: " (detector frame)"}

#: The subjects of the mass bands.
SUBJECTS = {"heavier": "Heavier body (m₁)", "lighter": "Lighter body (m₂)", "remnant": "Remnant"}

#: Mass bands, lowest first; they partition the mass axis.
BANDS = {
    "neutron_star": "neutron star",
    "lower_gap": "lower mass gap",
    "stellar_black_hole": "black hole below the gap",
    "pair_instability_gap": "pair-instability gap",
    "above_gap": "above the gap",
}
#: The separate question of a mass at or above the intermediate-mass threshold.
INTERMEDIATE_MASS = "intermediate mass"

#: The sky figure's legend: the two credible regions, the most probable position, and the
#: opening words of its alt text.
SKY_REGIONS = {0.5: "50 % credible region", 0.9: "90 % credible region"}
SKY_PEAK = "most probable position"
SKY_FIGURE_LEAD = "Sky map of the source's position"

#: Mass-band edges of the reference data.
EDGES = {
    "neutron_star_max": "maximum neutron-star mass",
    "lower_gap_top": "top of the lower mass gap",
    "pair_instability_lower": "lower edge of the pair-instability gap",
    "pair_instability_upper": "upper edge of the pair-instability gap",
    "intermediate_mass_min": "lower bound of intermediate-mass black holes",
}

#: The trade's source classes in words (their abbreviations are written out at first use).
CLASS_NAMES = {
    "BBH": "binary black hole",
    "BNS": "binary neutron star",
    "NSBH": "neutron star–black hole",
}

#: What a source class says in words (a headline starts with it).
CLASSES = {
    "BBH": "Two black holes",
    "BNS": "Two neutron stars",
    "NSBH": "A black hole and a neutron star",
}


@dataclass(frozen=True)
class WindowLabel:
    """A counterpart window's name and one plain sentence on what could be seen."""

    name: str
    plain: str


W = WindowLabel
#: Counterpart windows by key (the reference data's rest-frame windows, then the AGN-disk ones).
WINDOWS: dict[str, WindowLabel] = {
    "gamma_ray_burst": W(
        "short gamma-ray burst",
        "A brief flash of gamma rays within seconds of the merger, if a jet points our way.",
    ),
    "kilonova_blue": W(
        "optical and ultraviolet kilonova",
        "A new point of light in a galaxy, brightest within the first day or two.",
    ),
    "kilonova_red": W(
        "infrared kilonova",
        "The glow of freshly made heavy elements, fading over about two weeks.",
    ),
    "afterglow_rise": W(
        "X-ray and radio afterglow rise (off-axis)",
        "A jet seen from the side shows up in X-rays and radio after one to a few weeks.",
    ),
    "afterglow_peak": W(
        "afterglow peak (off-axis)",
        "The side-on afterglow brightens for months before it fades.",
    ),
    "neutrino_coincidence": W(
        "neutrino coincidence",
        "High-energy neutrinos arriving within minutes of the merger would be worth a look.",
    ),
    "agn_flare": W(
        "flare as the kicked remnant leaves its gas",
        "An optical or ultraviolet flare could appear once the kicked black hole plows out of "
        "the gas it held around itself.",
    ),
    "agn_repeat_flare": W(
        "repeat flare on the next disk crossing",
        "Half an orbit later the remnant crosses the disk again and could flare a second time.",
    ),
}
del W

#: Bands of light (and neutrinos) the windows are in.
WINDOW_BANDS = {
    "gamma_ray": "gamma rays",
    "optical_ultraviolet": "optical and ultraviolet",
    "infrared": "infrared",
    "x_ray_radio": "X-ray and radio",
    "neutrino": "neutrinos",
}


#: The event's status, as a row of the history and of the changes.
STATUS = "Status"
#: A value an estimate does not give, and a status the history does not record.
NOT_GIVEN = "not given"
NOT_RECORDED = "not recorded"

#: What an entry of the changes page and the feed says happened (by its kind).
CHANGE_KINDS = {
    "added": "added",
    "revised": "revised",
    "retracted": "retracted",
    "confirmed": "confirmed",
    "candidate": "made a candidate again",
}

#: The index's words for items a public build leaves out (internal builds only).
INTERNAL_ONLY = "internal only"
EMBARGOED_UNTIL = "embargoed until"


def estimate_value(path: str, frame: str) -> str:
    """The short label of a value of an estimate (``heavier.mass`` -> ``m₁``), saying when its
    masses were given in the detector frame (history lists, history figure, changes, feed)."""
    key = path.replace(".", "_")
    text = QUANTITIES[key].short
    if key.endswith("_mass") and frame in FRAME_SUFFIX:
        text += FRAME_SUFFIX[frame]
    return text


def parameter(key: str) -> str:
    """A calibration parameter (a quantity key or one of :data:`PARAMETERS`) in prose."""
    return QUANTITIES[key].in_prose if key in QUANTITIES else PARAMETERS.get(key, key)


def sentence(text: str) -> str:
    """``text`` with its first letter upper-case, to start a sentence (the rest unchanged)."""
    return text[:1].upper() + text[1:]
