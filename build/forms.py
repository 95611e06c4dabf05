"""A calculator's form and empty result panel, rendered at build time from its `describe` spec.

The page is readable and the form usable before any Python runs in the browser. Every text that
reaches the HTML goes through `html.escape`.
"""

from html import escape

from calc import api, units


def _attr(value):
    return escape(str(value), quote=True)


def _default_text(item, value):
    """The text a field starts with: a number in the declared unit is shown without the unit."""
    if value is None:
        return ""
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, (int, float)):
        return f"{value:g}"
    return str(value)


def _field_ids(prefix, name):
    return f"{prefix}-{name}", f"{prefix}-{name}-help", f"{prefix}-{name}-msg"


def _quantity_control(item, field_id, described, value, datalist_id):
    unit_hint = ", ".join(units.units_for(units.dimension_of(item.unit)))
    listed = f' list="{_attr(datalist_id)}"' if item.suggest == "voltages" and datalist_id else ""
    placeholder = "blank = not given" if item.optional else ""
    return (
        f'<input id="{field_id}" name="{_attr(item.name)}" type="text" inputmode="decimal" '
        f'enterkeyhint="done" autocomplete="off" autocapitalize="off" spellcheck="false" '
        f'value="{_attr(value)}" data-unit="{_attr(item.unit)}" aria-describedby="{described}"'
        f'{listed} placeholder="{_attr(placeholder)}" title="{_attr("Units: " + unit_hint)}">'
    )


def _text_control(item, field_id, described, value):
    """A free-text code with the calculator's common values offered (a datalist)."""
    listed = ""
    if item.suggestions:
        options = "".join(f'<option value="{_attr(v)}"></option>' for v in item.suggestions)
        listed = f' list="{field_id}-list"'
        tail = f'<datalist id="{field_id}-list">{options}</datalist>'
    else:
        tail = ""
    return (
        f'<input id="{field_id}" name="{_attr(item.name)}" type="text" autocomplete="off" '
        f'autocapitalize="characters" spellcheck="false" enterkeyhint="done" '
        f'value="{_attr(value)}" aria-describedby="{described}"{listed}>{tail}'
    )


def _options(pairs, selected):
    return "".join(
        f'<option value="{_attr(token)}"{" selected" if token == selected else ""}>'
        f"{escape(label)}</option>"
        for token, label in pairs
    )


def _select_control(item, field_id, described, value):
    if item.kind == "choice":
        body = _options(item.choices, value)
    elif item.kind == "flag":
        body = _options((("yes", "Yes"), ("no", "No")), value)
    else:  # size: grouped by system
        selected = value
        try:
            selected = units.parse_conductor_size(value).label if value else ""
        except units.UnitError:
            pass
        groups = (("AWG", units.AWG_SIZES), ("kcmil", units.KCMIL_SIZES), ("mm²", units.METRIC_SIZES))
        body = "".join(
            f'<optgroup label="{_attr(name)}">{_options(((s, s) for s in sizes), selected)}</optgroup>'
            for name, sizes in groups
        )
    return (
        f'<select id="{field_id}" name="{_attr(item.name)}" aria-describedby="{described}">'
        f"{body}</select>"
    )


def _field(item, prefix, value, datalist_id):
    field_id, help_id, msg_id = _field_ids(prefix, item.name)
    described = f"{help_id} {msg_id}"
    unit = f' <span class="fb-field__unit">{escape(item.unit)}</span>' if item.unit else ""
    if item.kind == "quantity":
        control = _quantity_control(item, field_id, described, value, datalist_id)
    elif item.kind == "text":
        control = _text_control(item, field_id, described, value)
    else:
        control = _select_control(item, field_id, described, value)
    help_text = escape(item.help) if item.help else ""
    group = f' data-group="{_attr(item.group)}"' if item.group else ""
    return (
        f'<div class="fb-field" data-field="{_attr(item.name)}"{group}>'
        f'<label for="{field_id}">{escape(item.label)}{unit}</label>{control}'
        f'<p class="fb-field__help" id="{help_id}">{help_text}</p>'
        f'<p class="fb-field__msg" id="{msg_id}" role="alert" hidden></p></div>'
    )


def _output(item):
    unit = "" if not item.unit else item.unit
    return (
        f'<div class="fb-out"><dt class="fb-out__label">{escape(item.label)}</dt>'
        f'<dd class="fb-out__value" data-output="{_attr(item.name)}" data-unit="{_attr(unit)}">'
        "—</dd></div>"
    )


def _section(kind, title, open_=False):
    return (
        f'<details class="fb-section fb-section--{kind}"{" open" if open_ else ""}>'
        f'<summary>{escape(title)}</summary><{"ol" if kind == "steps" else "ul"} '
        f'class="fb-{kind}"></{"ol" if kind == "steps" else "ul"}></details>'
    )


# --- jobs (issue 13): the "save to job" action and its form; jobs.js wires them ----------------

SAVE_BUTTON = (
    '<button type="button" class="fb-button" data-action="save" aria-expanded="false" '
    'aria-controls="{prefix}-save">Save to job</button>'
)


def _save_form(prefix):
    """The save form (hidden until the save action opens it) and the line that reports a save.

    It sits outside `.fb-form`, so its fields are never read as calculator inputs.
    """
    def field(name, label, help_text, control):
        return (
            f'<div class="fb-save__field"><label for="{prefix}-{name}">{label}</label>{control}'
            f'<p class="fb-save__help" id="{prefix}-{name}-help">{help_text}</p></div>'
        )

    common = 'autocomplete="off" spellcheck="false"'
    return (
        f'<form class="fb-save" id="{prefix}-save" hidden novalidate autocomplete="off">'
        '<p class="fb-save__title">Save this calculation to a job on this device</p>'
        + field("job_name", "Job", "An existing job’s name adds to that job; a new name starts one.",
                f'<input id="{prefix}-job_name" name="job_name" type="text" maxlength="120" '
                f'list="{prefix}-jobs" enterkeyhint="next" {common} '
                f'aria-describedby="{prefix}-job_name-help"><datalist id="{prefix}-jobs"></datalist>')
        + field("site", "Site", "Building, room or panel (kept with a new job).",
                f'<input id="{prefix}-site" name="site" type="text" maxlength="200" '
                f'enterkeyhint="next" {common} aria-describedby="{prefix}-site-help">')
        + field("note", "Note on this calculation", "What it is for, in your own words (optional).",
                f'<textarea id="{prefix}-note" name="note" rows="2" maxlength="1000" '
                f'aria-describedby="{prefix}-note-help"></textarea>')
        + '<div class="fb-save__buttons">'
        '<button type="submit" class="fb-button" data-action="save-confirm">Save</button>'
        '<button type="button" class="fb-button fb-button--quiet" data-action="save-cancel">Cancel'
        "</button></div></form>"
        '<p class="fb-save__msg" role="status" aria-live="polite" hidden></p>'
    )


# --- end jobs --------------------------------------------------------------------------------


def render_calculator(calculator_id, config, preset=None, index=0):
    """HTML of one calculator: engine status, form, actions and an empty result panel.

    Parameters
    ----------
    calculator_id : str
        A registered id.
    config : build.team.TeamConfig
        Supplies the region's and the team's defaults and the usual voltages.
    preset : dict, optional
        Raw values for some inputs (from an embedding block); they win over every default.
    index : int
        The calculator's position on its page, so element ids stay unique.
    """
    calculator = api.get(calculator_id)
    preset = preset or {}
    prefix = f"fb{index}"
    datalist_id = f"{prefix}-voltages"
    def field_html(item):
        value = preset.get(item.name, config.input_default(calculator_id, item))
        return _field(item, prefix, _default_text(item, value), datalist_id)

    fields = "".join(field_html(item) for item in calculator.inputs if not item.advanced)
    advanced = [item for item in calculator.inputs if item.advanced]
    if advanced:
        names = ", ".join(item.label.lower() for item in advanced[:3])
        fields += (
            f'<details class="fb-more"><summary>More inputs ({escape(names)}…)</summary>'
            f'<div class="fb-more__fields">{"".join(field_html(item) for item in advanced)}</div>'
            "</details>"
        )
    datalist = (
        f'<datalist id="{datalist_id}">'
        + "".join(f'<option value="{_attr(units.format_quantity(v, "V"))}"></option>' for v in config.system_voltages)
        + "</datalist>"
    )
    outputs = "".join(_output(item) for item in calculator.outputs)
    return (
        f'<section class="fb-calc" data-calculator="{_attr(calculator_id)}" data-state="starting" '
        f'data-engine="starting" data-index="{index}" aria-label="{_attr(calculator.title)}">'
        '<p class="fb-engine" role="status" aria-live="polite">'
        '<span class="fb-engine__lamp" aria-hidden="true"></span>'
        '<span class="fb-engine__text">Calculator engine starting…</span></p>'
        '<noscript><p class="fb-engine">The live calculator needs JavaScript; the method and '
        "sources on this page read without it.</p></noscript>"
        f'<form class="fb-form" novalidate autocomplete="off">{fields}{datalist}</form>'
        '<p class="fb-general-msg" role="alert" hidden></p>'
        '<div class="fb-result" aria-live="polite">'
        f'<dl class="fb-outputs">{outputs}</dl>'
        '<ul class="fb-checks"></ul>'
        '<div class="fb-charts"></div>'
        + _section("steps", "Method", open_=True)
        + _section("assumptions", "Assumptions")
        + _section("sources", "Sources")
        + _section("cautions", "Cautions", open_=True)
        + '<p class="fb-record"></p></div>'
        '<div class="fb-actions">'
        '<button type="button" class="fb-button" data-action="copy-link">Copy link to this calculation</button>'
        '<button type="button" class="fb-button" data-action="print">Print or save as PDF</button>'
        + SAVE_BUTTON.format(prefix=prefix)  # jobs (issue 13)
        + '<span class="fb-actions__note" role="status" aria-live="polite"></span></div>'
        + _save_form(prefix)  # jobs (issue 13)
        + "</section>"
    )
