"""The home page's launcher: calculators as tiles by group, each with the question it answers
and the words a technician would type to find it (issue 12, item 4).

The registry (calc.api.list_calculators) gives the ids, titles, summaries and groups, in site
order; QUESTIONS and WORDS below are ours. Both go into the page as data, so the filter
(site_src/assets/js/home.js) works offline and without the Python engine.
"""

from html import escape

from calc import api

# One line each, in the words of someone standing in front of the equipment.
QUESTIONS = {
    "conductor": "What resistance and reactance does this wire have?",
    "ampacity": "How many amps may this wire carry where it runs?",
    "voltage-drop": "How many volts does this run lose?",
    "wire-size": "What wire size keeps the drop in limits?",
    "max-length": "How far can this wire carry the load?",
    "line-loss": "What do the losses cost, and would a higher voltage pay?",
    "circuit-check": "Does this whole circuit pass, and what fails first?",
    "transformer-currents": "How many amps on each side of this transformer?",
    "transformer-size": "What size transformer does this load need?",
    "transformer-fault-current": "How much fault current can this transformer deliver?",
    "transformer-regulation": "How far does the voltage sag on load, and which tap fixes it?",
    "transformer-efficiency": "How much does this transformer waste as heat?",
    "buck-boost": "Can a small transformer lift or trim this supply?",
    "supply-mismatch": "Will this equipment run on that voltage or frequency?",
    "motor-current": "How many amps does this motor draw, running and starting?",
    "motor-start-dip": "Will the lights dim when it starts?",
    "back-emf": "What does this DC motor do as it starts and runs?",
    "fault-current": "Can the breakers at each panel interrupt a fault?",
    "ground-fault-trip": "Will the breaker trip on a fault to the case?",
    "gfci-check": "Did the GFCI or RCD trip in time?",
    "switching-transient": "How does the current or voltage settle after switching?",
    "rlc-resonance": "At what frequency does this circuit resonate?",
    "inductive-kick": "How big is the spike when this coil lets go?",
    "pf-correction": "How many kvar fix the power factor, and will the bank resonate?",
}

# Words and phrases from the field (and from the trade's abbreviations), matched by the home
# page's filter together with the title, the question, the summary and the group.
WORDS = {
    "conductor": ("wire resistance", "ohms", "ohms per 1000 ft", "ohm/km", "reactance",
                  "impedance", "ac resistance", "skin effect", "cable", "copper", "aluminum",
                  "aluminium", "conduit"),
    "ampacity": ("ampacity", "current rating", "current carrying capacity", "wire amps",
                 "how many amps", "derating", "ambient", "bundled", "grouping", "310.16",
                 "terminal rating", "75 °c", "cable rating", "wire size"),
    "voltage-drop": ("voltage drop", "vd", "volts lost", "long run", "low voltage at the end",
                     "feeder", "branch circuit", "3 %", "5 %", "dim", "brownout", "wire size"),
    "wire-size": ("wire size", "cable size", "gauge", "awg", "kcmil", "mm²", "upsize",
                  "what wire", "conductor size", "long run", "voltage drop"),
    "max-length": ("how far", "max run", "maximum length", "longest run", "distance",
                   "length limit", "voltage drop", "wire size"),
    "line-loss": ("losses", "i²r", "i2r", "energy cost", "kwh", "payback", "heat in cable",
                  "step up", "higher voltage", "bigger wire", "running cost"),
    "circuit-check": ("whole circuit", "branch circuit", "feeder", "breaker size",
                      "fuse size", "wire size", "ampacity", "voltage drop", "grounding conductor",
                      "250.122", "ocpd", "trip", "motor circuit", "inspection"),
    "transformer-currents": ("kva", "transformer amps", "full load amps", "fla", "flc",
                             "primary current", "secondary current", "turns ratio",
                             "voltage ratio", "xfmr"),
    "transformer-size": ("kva", "what size transformer", "transformer rating", "sizing",
                         "load", "growth", "spare capacity", "xfmr", "oversize"),
    "transformer-fault-current": ("available fault current", "short circuit", "%z",
                                  "percent impedance", "aic", "kaic", "sccr", "bolted fault",
                                  "x/r", "kva", "xfmr", "arc flash"),
    "transformer-regulation": ("taps", "tap setting", "voltage low on load", "regulation",
                               "sag", "%z", "voltage high at night", "xfmr"),
    "transformer-efficiency": ("losses", "efficiency", "no-load loss", "core loss",
                               "copper loss", "hot transformer", "energy cost", "kwh", "xfmr"),
    "buck-boost": ("buck boost", "buck-boost", "208 to 230", "208 to 240", "raise voltage",
                   "lower voltage", "autotransformer", "boost", "buck", "low voltage",
                   "high voltage", "kva"),
    "supply-mismatch": ("foreign supply", "50 hz", "60 hz", "230 v equipment",
                        "120 v equipment", "imported", "frequency", "v/hz", "step-down",
                        "step-up", "motor speed", "overheating"),
    "motor-current": ("motor amps", "fla", "flc", "full load amps", "locked rotor", "lra",
                      "code letter", "inrush", "starting current", "hp", "horsepower", "kw",
                      "star delta", "wye delta", "soft starter", "vfd", "nameplate", "430.250"),
    "motor-start-dip": ("lights dim", "lights flicker", "dimming", "flicker", "voltage dip",
                        "dip", "sag", "brownout", "motor start", "compressor start",
                        "contactor chatter", "contactor drops out", "inrush", "starting"),
    "back-emf": ("dc motor", "back emf", "counter emf", "cemf", "armature", "field",
                 "starting resistor", "shunt", "series motor", "permanent magnet", "pmdc",
                 "run-up", "stall", "speed"),
    "fault-current": ("fault current", "available fault current", "short circuit", "aic",
                      "kaic", "interrupting rating", "sccr", "panel", "point to point",
                      "bolted fault", "arc flash", "breaker rating"),
    "ground-fault-trip": ("breaker trip", "won't trip", "does it trip", "ground fault",
                          "earth fault", "zs", "loop impedance", "efli", "fault to case",
                          "bonding", "grounding", "disconnection time", "magnetic trip",
                          "instantaneous", "shock", "touch voltage"),
    "gfci-check": ("gfci", "gfi", "rcd", "rcbo", "elcb", "rccb", "gfci breaker", "trip test",
                   "trip time", "tester", "30 ma", "5 ma", "nuisance trip", "won't trip", "ground fault",
                   "earth leakage"),
    "switching-transient": ("time constant", "tau", "rc", "rl", "rlc", "capacitor charge",
                            "discharge", "ringing", "overshoot", "settling", "inrush",
                            "switch on", "switch off"),
    "rlc-resonance": ("resonance", "resonant frequency", "q factor", "bandwidth",
                      "tuned circuit", "filter", "lc", "rlc", "series resonance",
                      "parallel resonance", "harmonics"),
    "inductive-kick": ("coil", "relay coil", "contactor coil", "solenoid", "flyback diode",
                       "freewheel diode", "snubber", "mov", "varistor", "zener", "spike",
                       "arcing contacts", "suppression", "kickback", "back emf"),
    "pf-correction": ("power factor", "pf", "capacitor bank", "capacitors", "kvar",
                      "reactive power", "utility penalty", "demand charge", "harmonics",
                      "resonance", "detuned", "kva", "cos phi"),
}


class HomeDataError(ValueError):
    """The launcher's table and the registry disagree."""


def missing_entries(entries):
    """Registered ids without a question or words, and table ids no longer registered."""
    ids = [entry["id"] for entry in entries]
    lacking = [i for i in ids if i not in QUESTIONS or i not in WORDS]
    unknown = sorted((set(QUESTIONS) | set(WORDS)) - set(ids))
    return lacking, unknown


def _tile(entry, href):
    """One calculator as a link tile; its search words ride along as data attributes."""
    question = QUESTIONS.get(entry["id"], entry["title"])
    words = " | ".join(WORDS.get(entry["id"], ()))
    return (
        f'<li class="fb-tiles__item"><a class="fb-tile" href="{escape(href, quote=True)}" '
        f'data-tile="{escape(entry["id"], quote=True)}" '
        f'data-group="{escape(entry["group"], quote=True)}" '
        f'data-words="{escape(words, quote=True)}" '
        f'data-summary-text="{escape(entry["summary"], quote=True)}">'
        f'<span class="fb-tile__question">{escape(question)}</span>'
        f'<span class="fb-tile__title">{escape(entry["title"])}</span></a></li>'
    )


def launcher(relative_url):
    """Markdown with HTML blocks: the filter, the recent calculations and the tiles by group.

    Parameters
    ----------
    relative_url : callable
        Maps a site URL ("calculators/voltage-drop/") to one relative to the page.
    """
    entries = api.list_calculators()
    lacking, unknown = missing_entries(entries)
    if unknown:
        raise HomeDataError(f"build/home.py names calculators that are not registered: {unknown}")
    groups = {}
    for entry in entries:
        groups.setdefault(entry["group"], []).append(
            _tile(entry, relative_url(f"calculators/{entry['id']}/")))
    finder = (
        '<div class="fb-finder" role="search" data-finder>'
        '<label class="fb-finder__label" for="fb-find">Find a calculator</label>'
        '<input class="fb-finder__input" id="fb-find" name="find" type="search" '
        'autocomplete="off" autocapitalize="off" spellcheck="false" enterkeyhint="go" '
        'aria-describedby="fb-find-hint fb-find-count" aria-controls="fb-find-matches">'
        '<p class="fb-finder__hint" id="fb-find-hint">Say what you are looking at: '
        "lights dim, breaker won’t trip, wire size, motor amps, GFCI, kVA… "
        "Enter opens the first match.</p>"
        '<p class="fb-finder__count" id="fb-find-count" role="status" aria-live="polite" '
        'aria-atomic="true"></p>'
        '<ol class="fb-tiles fb-finder__matches" id="fb-find-matches" data-matches hidden></ol>'
        "</div>"
    )
    recent = (
        '<section class="fb-recent" data-recent aria-labelledby="fb-recent-title" hidden>'
        '<h2 class="fb-recent__title" id="fb-recent-title">Opened on this device</h2>'
        '<ol class="fb-recent__list" data-recent-list></ol>'
        '<button type="button" class="fb-button fb-button--quiet" data-action="recent-clear">'
        "Clear this list</button></section>"
    )
    sections = "\n\n".join(
        f'<section class="fb-group" data-group-section markdown="1">\n\n## {group}\n\n'
        f'<ul class="fb-tiles">{"".join(tiles)}</ul>\n\n</section>'
        for group, tiles in groups.items()
    )
    return f"{finder}\n\n{recent}\n\n<div class=\"fb-groups\" data-groups markdown=\"1\">\n\n{sections}\n\n</div>"
