"""Every label a reader sees for a quantity, a mass band or edge, a subject or a window: one table.

The sheet's tables, its figures and their alt text, the history list, the changes page, the
feed, the exports' column descriptions and the caveats all take their words from here, so one
quantity is named the same way everywhere. Keys are the JSON export's (``heavier_mass``, ...)
and the reference data's (``lower_gap``, ``kilonova_blue``, ...).

The labels are kept messages (:class:`~factsheet.i18n.Text`): each is its English wording as a
``str`` (what the exports and comparisons see) and is shown in the language in use. Symbols
(``m₁``, ``χ_eff``, ``q``) are the same in every language and stay plain strings. Build a
sentence around a label with a message that has a placeholder for it, never by concatenation:
``Text("{name} straddles ...", name=QUANTITIES[key].in_prose)``.
"""

from __future__ import annotations

from dataclasses import dataclass

from factsheet.i18n import N_, Later, Text
from factsheet.model import DETECTOR

#: A label of a value whose masses were given in the detector frame (``m₁ (detector frame)``).
DETECTOR_FRAME = N_("{label} (detector frame)")


@dataclass(frozen=True)
class QuantityLabel:
    """How one quantity is named: in full (tables, exports), short (figures, lists), in prose."""

    name: str
    short: str
    group: str  # the part of the sheet it belongs to: a key of GROUPS
    prose: str = ""  # inside a sentence (its own message: languages differ in case and article)

    @property
    def in_prose(self) -> str:
        return self.prose or self.name


Q = QuantityLabel
#: Quantities in the order a sheet lists them, each in the group of the sheet it belongs to.
QUANTITIES: dict[str, QuantityLabel] = {
    "heavier_mass": Q(
        Text("Mass of the heavier body m₁"), "m₁", "bodies", Text("the heavier body's mass")
    ),
    "lighter_mass": Q(
        Text("Mass of the lighter body m₂"), "m₂", "bodies", Text("the lighter body's mass")
    ),
    "heavier_mass_detector": Q(
        Text("Mass of the heavier body (detector frame)"),
        Text(DETECTOR_FRAME, label="m₁"),
        "bodies",
        Text("mass of the heavier body (detector frame)"),
    ),
    "lighter_mass_detector": Q(
        Text("Mass of the lighter body (detector frame)"),
        Text(DETECTOR_FRAME, label="m₂"),
        "bodies",
        Text("mass of the lighter body (detector frame)"),
    ),
    "total_mass": Q(Text("Total mass"), Text("Total mass"), "bodies", Text("total mass")),
    "total_mass_detector": Q(
        Text("Total mass (detector frame)"),
        Text("Total mass (detector frame)"),
        "bodies",
        Text("total mass (detector frame)"),
    ),
    "chirp_mass": Q(Text("Chirp mass"), Text("Chirp mass"), "bodies", Text("chirp mass")),
    "chirp_mass_detector": Q(
        Text("Chirp mass (detector frame)"),
        Text("Chirp mass (detector frame)"),
        "bodies",
        Text("chirp mass (detector frame)"),
    ),
    "mass_ratio": Q(Text("Mass ratio q = m₂/m₁"), "q", "bodies", Text("the mass ratio")),
    "heavier_spin": Q(
        Text("Aligned spin of the heavier body χ₁"),
        "χ₁",
        "bodies",
        Text("the heavier body's spin"),
    ),
    "lighter_spin": Q(
        Text("Aligned spin of the lighter body χ₂"),
        "χ₂",
        "bodies",
        Text("the lighter body's spin"),
    ),
    "heavier_spin_magnitude": Q(
        Text("Spin magnitude of the heavier body a₁"),
        "a₁",
        "bodies",
        Text("the heavier body's spin magnitude"),
    ),
    "heavier_tilt": Q(
        Text("Spin tilt of the heavier body θ₁ (to the orbit's axis)"),
        "θ₁",
        "bodies",
        Text("the heavier body's spin tilt"),
    ),
    "lighter_spin_magnitude": Q(
        Text("Spin magnitude of the lighter body a₂"),
        "a₂",
        "bodies",
        Text("the lighter body's spin magnitude"),
    ),
    "lighter_tilt": Q(
        Text("Spin tilt of the lighter body θ₂ (to the orbit's axis)"),
        "θ₂",
        "bodies",
        Text("the lighter body's spin tilt"),
    ),
    "effective_spin": Q(
        Text("Effective spin χ_eff"), "χ_eff", "bodies", Text("the effective spin")
    ),
    "precession_spin": Q(
        Text("Effective precession spin χ_p"),
        "χ_p",
        "bodies",
        Text("the effective precession spin"),
    ),
    "remnant_mass": Q(Text("Remnant mass"), Text("Remnant mass"), "remnant", Text("remnant mass")),
    "remnant_spin": Q(Text("Remnant spin"), Text("Remnant spin"), "remnant", Text("remnant spin")),
    "radiated_mass": Q(
        Text("Mass-energy radiated"),
        Text("Mass-energy radiated"),
        "remnant",
        Text("mass-energy radiated"),
    ),
    "energy_radiated": Q(
        Text("Energy radiated"), Text("Energy radiated"), "remnant", Text("energy radiated")
    ),
    "peak_luminosity": Q(
        Text("Peak luminosity"), Text("Peak luminosity"), "remnant", Text("peak luminosity")
    ),
    "kick_velocity": Q(
        Text("Recoil kick"), Text("Recoil kick"), "remnant", Text("the recoil kick")
    ),
    "ringdown_frequency": Q(
        Text("Ringdown frequency (observed)"),
        Text("Ringdown"),
        "signal",
        Text("ringdown frequency (observed)"),
    ),
    "ringdown_damping_time": Q(
        Text("Ringdown damping time (observed)"),
        Text("Damping time"),
        "signal",
        Text("ringdown damping time (observed)"),
    ),
    "isco_frequency": Q(
        Text("ISCO frequency, end of inspiral (observed)"),
        "ISCO",
        "signal",
        Text("the ISCO frequency"),
    ),
    "time_in_band": Q(
        Text("Time in band (leading order)"),
        Text("Time in band"),
        "signal",
        Text("time in band (leading order)"),
    ),
    "cycles_in_band": Q(
        Text("Cycles in band (leading order)"),
        Text("Cycles in band"),
        "signal",
        Text("cycles in band (leading order)"),
    ),
    "strain_amplitude": Q(
        Text("Peak strain, optimally oriented (leading order)"),
        Text("Peak strain"),
        "signal",
        Text("peak strain, optimally oriented (leading order)"),
    ),
    "arm_length_change": Q(
        Text("Arm-length change per arm (leading order)"),
        Text("Arm-length change"),
        "signal",
        Text("arm-length change per arm (leading order)"),
    ),
    "distance": Q(
        Text("Luminosity distance"), Text("Distance"), "where", Text("the luminosity distance")
    ),
    "redshift": Q(Text("Redshift z"), "z", "where", Text("the redshift")),
    "lookback_time": Q(
        Text("Time since the merger (lookback time)"),
        Text("Lookback time"),
        "where",
        Text("the lookback time"),
    ),
}
del Q

#: The groups of a sheet's numbers, in page order: each answers one question a reader has.
GROUPS = {
    "bodies": Text("The two bodies"),
    "remnant": Text("What they became"),
    "signal": Text("The signal in the detectors"),
    "where": Text("How far and how long ago"),
}

#: How a number of a sheet came about, for the mark beside it.
KINDS = {
    "given": Text("measured"),  # an input value, shown as given
    "fixed": Text("fixed in the analysis"),  # an exact input value: assumed, not measured
    "samples": Text("measured"),  # summarised from the samples file
    "derived": Text("derived"),  # computed here from the inputs
}

#: Names in the figures for what is not a quantity of a sheet: axes, marks and the merger's rows.
FIGURE_NAMES = {
    "frequency": Text("Frequency"),
    "time_before_merger": Text("Time before merger"),
    # TRANSLATORS: the axis of the time after the merger, beside "Time before merger"
    "time_after_merger": Text("after"),
    "band_edge": Text("band edge"),
    "merger": Text("merger"),
    "merger_energy": Text("this merger (gravitational waves)"),
    "merger_peak": Text("this merger at its peak"),
}

#: Parameters that fits are calibrated on but that are not quantities of a sheet.
PARAMETERS = {
    "compactness": Text("the neutron star's compactness"),
    "spin": Text("the black hole's spin"),
}

#: The frame masses were given in, as a message around their labels in an estimate.
FRAME_LABEL = {DETECTOR: DETECTOR_FRAME}

#: The subjects of the mass bands.
SUBJECTS = {
    "heavier": Text("Heavier body (m₁)"),
    "lighter": Text("Lighter body (m₂)"),
    "remnant": Text("Remnant"),
}

#: Mass bands, lowest first; they partition the mass axis.
BANDS = {
    "neutron_star": Text("neutron star"),
    "lower_gap": Text("lower mass gap"),
    "stellar_black_hole": Text("black hole below the gap"),
    "pair_instability_gap": Text("pair-instability gap"),
    "above_gap": Text("above the gap"),
}
#: The separate question of a mass at or above the intermediate-mass threshold.
INTERMEDIATE_MASS = Text("intermediate mass")

#: The sky figure's legend: the two credible regions, the most probable position, and the
#: opening words of its alt text.
SKY_REGIONS = {0.5: Text("50 % credible region"), 0.9: Text("90 % credible region")}
SKY_PEAK = Text("most probable position")
SKY_FIGURE_LEAD = Text("Sky map of the source's position")

#: Mass-band edges of the reference data.
EDGES = {
    # TRANSLATORS: the edges are also named inside sentences ("... straddles the EDGE"); a
    # name with the same grammatical gender for all five keeps those sentences right
    "neutron_star_max": Text("maximum neutron-star mass"),
    "lower_gap_top": Text("top of the lower mass gap"),
    "pair_instability_lower": Text("lower edge of the pair-instability gap"),
    "pair_instability_upper": Text("upper edge of the pair-instability gap"),
    "intermediate_mass_min": Text("lower bound of intermediate-mass black holes"),
}

#: The trade's source classes in words (their abbreviations are written out at first use).
CLASS_NAMES = {
    "BBH": Text("binary black hole"),
    "BNS": Text("binary neutron star"),
    "NSBH": Text("neutron star–black hole"),
}

#: What a source class says in words (a headline starts with it).
CLASSES = {
    "BBH": Text("Two black holes"),
    "BNS": Text("Two neutron stars"),
    "NSBH": Text("A black hole and a neutron star"),
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
        Text("short gamma-ray burst"),
        Text("A brief flash of gamma rays within seconds of the merger, if a jet points our way."),
    ),
    "kilonova_blue": W(
        Text("optical and ultraviolet kilonova"),
        Text("A new point of light in a galaxy, brightest within the first day or two."),
    ),
    "kilonova_red": W(
        Text("infrared kilonova"),
        Text("The glow of freshly made heavy elements, fading over about two weeks."),
    ),
    "afterglow_rise": W(
        Text("X-ray and radio afterglow rise (off-axis)"),
        Text("A jet seen from the side shows up in X-rays and radio after one to a few weeks."),
    ),
    "afterglow_peak": W(
        Text("afterglow peak (off-axis)"),
        Text("The side-on afterglow brightens for months before it fades."),
    ),
    "neutrino_coincidence": W(
        Text("neutrino coincidence"),
        Text("High-energy neutrinos arriving within minutes of the merger would be worth a look."),
    ),
    "agn_flare": W(
        Text("flare as the kicked remnant leaves its gas"),
        Text(
            "An optical or ultraviolet flare could appear once the kicked black hole plows out "
            "of the gas it held around itself."
        ),
    ),
    "agn_repeat_flare": W(
        Text("repeat flare on the next disk crossing"),
        Text(
            "Half an orbit later the remnant crosses the disk again and could flare a second time."
        ),
    ),
}
del W

#: Bands of light (and neutrinos) the windows are in.
WINDOW_BANDS = {
    "gamma_ray": Text("gamma rays"),
    "optical_ultraviolet": Text("optical and ultraviolet"),
    "infrared": Text("infrared"),
    "x_ray_radio": Text("X-ray and radio"),
    "neutrino": Text("neutrinos"),
}


#: The event's status, as a row of the history and of the changes.
STATUS = Text("Status")
#: A value an estimate does not give, and a status the history does not record.
NOT_GIVEN = Text("not given")
NOT_RECORDED = Text("not recorded")

#: What an entry of the changes page and the feed says happened (by its kind).
CHANGE_KINDS = {
    "added": Text("added"),
    "revised": Text("revised"),
    "retracted": Text("retracted"),
    "confirmed": Text("confirmed"),
    "candidate": Text("made a candidate again"),
}

#: The index's words for items a public build leaves out (internal builds only).
INTERNAL_ONLY = Text("internal only")
EMBARGOED_UNTIL = Text("embargoed until")


def embargoed_until(time: str) -> Text:
    """The index's words for an item embargoed until ``time`` (UTC, as written in the input):
    ``embargoed until 2035-01-17 04:12 UTC``, one message so each language orders it."""
    return Text("embargoed until {time} UTC", time=time)


def estimate_value(path: str, frame: str) -> str:
    """The short label of a value of an estimate (``heavier.mass`` -> ``m₁``), saying when its
    masses were given in the detector frame (history lists, history figure, changes, feed)."""
    key = path.replace(".", "_")
    label = QUANTITIES[key].short
    if key.endswith("_mass") and frame in FRAME_LABEL:
        return Text(FRAME_LABEL[frame], label=label)
    return label


def parameter(key: str) -> str:
    """A calibration parameter (a quantity key or one of :data:`PARAMETERS`) in prose."""
    return QUANTITIES[key].in_prose if key in QUANTITIES else PARAMETERS.get(key, key)


def sentence(text: str) -> str:
    """``text`` with its first letter upper-case, to start a sentence (the rest unchanged).

    A kept message (:class:`~factsheet.i18n.Text`) stays one: it is capitalised in the language
    it is shown in (the English wording is not cut up)."""
    if isinstance(text, Text):
        return Text(_WHOLE, text=Later(capitalised, text))
    return capitalised(text)


#: A message that is its one parameter (not extracted: there are no words to translate).
_WHOLE = "{text}"


def capitalised(text: str) -> str:
    """``text`` in the language in use with its first letter upper-case."""
    shown = str(text)
    return shown[:1].upper() + shown[1:]
