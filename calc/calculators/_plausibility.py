"""The `plausibility` check every calculator carries: are the inputs and results those of real
equipment, and does the method still hold? Warn (never fail) and say why.
"""

CHECK_NAME = "plausibility"
ORDINARY = "Inputs and results are in the range of real equipment and of the method."


def plausibility(result, reasons):
    """Add the `plausibility` check to `result`: pass when `reasons` is empty, else warn with
    every reason joined (each one says which value, why, and what is usual)."""
    reasons = [reason.strip().rstrip(".") for reason in reasons if reason and reason.strip()]
    if not reasons:
        result.check(CHECK_NAME, "pass", ORDINARY)
        return
    result.check(CHECK_NAME, "warn", "Check the inputs: " + "; ".join(reasons) + ".")


def outside(value, low, high):
    """True when `value` lies outside [low, high] (either bound may be None)."""
    return (low is not None and value < low) or (high is not None and value > high)
