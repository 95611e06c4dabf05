"""Line losses: the year's energy and cost of a run's I²R loss and of a transformer's losses,
the loss factor of a varying load, and the simple payback of a larger conductor.

Quantities follow the nomenclature page: power [W], apparent power [VA], time [s], energy [J],
cost in the team's currency units (a plain number). A run's current and I²R loss come from
calc.voltage_drop (load_current, solve_run).
"""

from typing import NamedTuple

from calc.errors import ParameterError

# 1 kWh = 1000 W × 3600 s, exact (SI Brochure, 9th ed., 2019, Table 8: h = 3600 s).
J_PER_KWH = 3.6e6
# The Julian year, 365.25 d = 31 557 600 s (ISO 80000-3 symbol "a"; IAU) — from memory. Used
# only to state a payback in seconds; the calculation itself counts operating years.
YEAR_S = 365.25 * 86400.0
# A payback longer than this is reported as "never" rather than as a number.
MAX_PAYBACK_YEARS = 1000.0
# Longest year of operation: 366 days (a leap year), 8784 h.
HOURS_IN_LEAP_YEAR = 8784

# Buller & Woodrow's empirical relation between loss factor and load factor for distribution
# feeders: LsF = 0.3 LF + 0.7 LF². F. H. Buller and C. A. Woodrow, "Load factor — equivalent
# hour values compared", Electrical World, vol. 92, 1928; quoted by T. Gönen, Electric Power
# Distribution System Engineering, 2nd ed., ch. 2 (loss factor) — both from memory.
BULLER_WOODROW = (0.3, 0.7)


def loss_factor(load_factor):
    """Loss factor from load factor by the Buller & Woodrow relation.

    Parameters
    ----------
    load_factor : float
        Average load over peak load during the operating hours, in [0, 1] [-].

    Returns
    -------
    float
        Loss factor [-]: average I²R loss over the loss at peak load, in [0, 1].

    Raises
    ------
    calc.errors.ParameterError
        For a load factor outside [0, 1].

    Notes
    -----
    LsF = 0.3 LF + 0.7 LF². It lies between LF² (a flat load) and LF (an on/off load), the
    bounds any load shape obeys.

    References
    ----------
    F. H. Buller and C. A. Woodrow, Electrical World, vol. 92, 1928; T. Gönen, Electric Power
    Distribution System Engineering, 2nd ed., ch. 2 — both from memory.

    Examples
    --------
    >>> round(loss_factor(0.6), 3)
    0.432
    """
    if not 0.0 <= load_factor <= 1.0:
        raise ParameterError("load_factor", load_factor,
                             f"load factor must lie in [0, 1], not {load_factor!r}")
    linear, square = BULLER_WOODROW
    return linear * load_factor + square * load_factor * load_factor


def annual_loss_energy(peak_loss, operating_time, loss_factor=1.0, no_load_loss=0.0,
                       energised_time=0.0):
    """Energy lost in a year.

    Parameters
    ----------
    peak_loss : float
        Load-dependent (I²R) loss at the given load [W].
    operating_time : float
        Time at load in the year [s].
    loss_factor : float
        Average over peak of the load-dependent loss, in [0, 1] [-]; 1 for a load that runs
        flat.
    no_load_loss : float
        Loss that does not depend on the load (transformer cores) [W].
    energised_time : float
        Time in the year the no-load loss is drawn [s].

    Returns
    -------
    float
        Energy [J].

    Raises
    ------
    calc.errors.ParameterError
        For a negative loss or time, or a loss factor outside [0, 1].

    Notes
    -----
    E = P_peak LsF t_op + P₀ t_en. The loss factor is the average I²R loss over the loss at
    peak, so it turns the peak loss into the year's energy; core loss does not depend on the
    load and counts for every hour energised.

    References
    ----------
    T. Gönen, Electric Power Distribution System Engineering, 2nd ed., ch. 2 (loss factor) —
    from memory.

    Examples
    --------
    >>> annual_loss_energy(1000.0, 3600.0 * 4000) / 3.6e6
    4000.0
    """
    given = {"peak_loss": peak_loss, "operating_time": operating_time,
             "no_load_loss": no_load_loss, "energised_time": energised_time}
    for name, value in given.items():
        if not value >= 0.0:
            raise ParameterError(name, value, "losses and times must be zero or more")
    if not 0.0 <= loss_factor <= 1.0:
        raise ParameterError("loss_factor", loss_factor,
                             f"loss factor must lie in [0, 1], not {loss_factor!r}")
    return peak_loss * loss_factor * operating_time + no_load_loss * energised_time


def energy_cost(energy, tariff):
    """Cost of energy at a flat tariff.

    Parameters
    ----------
    energy : float
        Energy [J].
    tariff : float
        Price per kWh [currency units / kWh].

    Returns
    -------
    float
        Cost [currency units].

    Raises
    ------
    calc.errors.ParameterError
        For a negative tariff.

    Notes
    -----
    C = E / (3.6 MJ/kWh) × tariff.

    References
    ----------
    SI Brochure, 9th ed., 2019, Table 8 (1 h = 3600 s, so 1 kWh = 3.6 MJ).

    Examples
    --------
    >>> energy_cost(3.6e9, 0.15)
    150.0
    """
    if not tariff >= 0.0:
        raise ParameterError("tariff", tariff, f"the tariff must be zero or more, not {tariff!r}")
    return energy / J_PER_KWH * tariff


def payback_period(extra_cost, annual_saving):
    """Simple payback of an extra first cost from a yearly saving.

    Parameters
    ----------
    extra_cost : float
        Extra installed cost, zero or more [currency units].
    annual_saving : float
        Saving per year of operation [currency units / year].

    Returns
    -------
    float or None
        The payback [s], counted in Julian years; None when the saving is zero or negative, or
        the payback would exceed MAX_PAYBACK_YEARS (it never pays back: the division is never
        taken to infinity).

    Raises
    ------
    calc.errors.ParameterError
        For a negative extra cost.

    Notes
    -----
    t = extra cost / annual saving years; no discounting, no change of tariff: a simple
    payback.

    References
    ----------
    Simple payback as the trade uses it (common practice); the Julian year of 365.25 d,
    ISO 80000-3 — from memory.

    Examples
    --------
    >>> payback_period(1200.0, 300.0) / YEAR_S
    4.0
    """
    if not extra_cost >= 0.0:
        raise ParameterError("extra_cost", extra_cost,
                             f"the extra cost must be zero or more, not {extra_cost!r}")
    if not annual_saving > 0.0 or extra_cost > MAX_PAYBACK_YEARS * annual_saving:
        return None
    return extra_cost / annual_saving * YEAR_S


class TransformerLosses(NamedTuple):
    """One transformer's losses at a load (SI units)."""

    rating: float  # [VA]
    no_load_loss: float  # [W]
    rated_load_loss: float  # [W] at rating
    load_loss: float  # [W] at this load
    loading: float  # S / S_r [-]


def transformer_losses(rating, no_load_loss, rated_load_loss, apparent_power):
    """A transformer's no-load and load losses at the apparent power it carries.

    Parameters
    ----------
    rating : float
        Rated apparent power S_r [VA].
    no_load_loss : float
        No-load (core) loss P₀ [W], the same at every load.
    rated_load_loss : float
        Load (winding) loss at rated current P_k [W].
    apparent_power : float
        Apparent power carried S [VA].

    Returns
    -------
    TransformerLosses
        The figures given, the load loss at S [W] and the loading S / S_r [-].

    Raises
    ------
    calc.errors.ParameterError
        For a rating not above zero or a negative loss.

    Notes
    -----
    P = P₀ + P_k (S / S_r)²: the load loss goes with the square of the current.

    References
    ----------
    IEC 60076-1, definitions of no-load and load loss; S. J. Chapman, Electric Machinery
    Fundamentals, 5th ed., section 2.7 — both from memory.

    Examples
    --------
    >>> losses = transformer_losses(15e3, 100.0, 300.0, 7.5e3)
    >>> losses.load_loss, losses.loading
    (75.0, 0.5)
    """
    if not rating > 0.0:
        raise ParameterError("rating", rating, f"the rating must be more than 0 VA, not "
                             f"{rating!r} VA")
    for name, value in (("no_load_loss", no_load_loss), ("rated_load_loss", rated_load_loss)):
        if not value >= 0.0:
            raise ParameterError(name, value, f"a loss must be zero or more, not {value!r} W")
    loading = apparent_power / rating
    return TransformerLosses(rating, no_load_loss, rated_load_loss,
                             loading * loading * rated_load_loss, loading)
