"""Source and caution texts that calculators of more than one domain cite, worded once.

Texts used by one calculator live in its own module; safety cautions shared by all live in
calc.cautions.
"""

# IEC 60909-0 short-circuit method, cited by transformer-fault-current and fault-current.
SOURCE_IEC60909 = (
    "IEC 60909-0: voltage factor c (Table 1), network feeder Z_Q = c U² / S''kQ (§6.2), "
    "transformer correction K_T = 0.95 c_max / (1 + 0.6 x_T) (§6.3.3), peak factor κ = 1.02 + "
    "0.98 e^(−3R/X) (§4.3.1.1), line-to-earth I''k1 (§4.2.1.3). c, K_T and κ read, as "
    "reproduced in pandapower's documentation (doc/shortcircuit/); Z_Q, I''k1 and the clause "
    "numbers from memory."
)
