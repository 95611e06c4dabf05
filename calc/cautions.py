"""Safety cautions shared by the calculators, worded once so every result says them the same way."""

DE_ENERGISE = (
    "De-energise, lock out and tag out before touching conductors or terminals, and verify the "
    "absence of voltage with a meter rated for the location (test it on a known live source "
    "before and after)."
)

QUALIFIED = (
    "Work on electrical installations only as a qualified person, wearing the PPE your "
    "organisation's risk assessment requires; arc-flash hazard is a separate study."
)

LOCAL_CODE = (
    "These figures are planning estimates from the stated assumptions; local codes (NEC, CEC, "
    "BS 7671, IEC 60364 or your authority) and licensed practice decide what is installed."
)

BACKFEED = (
    "A transformer is live on both windings if either is energised: back-feed from a generator, "
    "UPS or PV system makes the primary dangerous even with its supply switched off."
)

MEDIUM_VOLTAGE = (
    "Above 1000 V only persons trained and authorised for medium/high voltage may operate or "
    "approach the equipment; clearances and switching procedures apply."
)

COMMON = (DE_ENERGISE, QUALIFIED, LOCAL_CODE)
