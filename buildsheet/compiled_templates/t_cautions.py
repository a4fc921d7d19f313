# cautions.j2 compiled by jinja2 3.1.6: written by sheet.write_compiled_templates(), do not edit
from jinja2.runtime import LoopContext, Macro, Markup, Namespace, TemplateNotFound, TemplateReference, TemplateRuntimeError, Undefined, escape, identity, internalcode, markup_join, missing, str_join
name = 'cautions.j2'

def root(context, missing=missing):
    resolve = context.resolve_or_missing
    undefined = environment.undefined
    concat = environment.concat
    cond_expr_undefined = Undefined
    if 0: yield None
    l_0_findings = resolve('findings')
    l_0_top_height = resolve('top_height')
    l_0_power = resolve('power')
    l_0_v_open_rms = resolve('v_open_rms')
    l_0_v_open_pk = resolve('v_open_pk')
    l_0_v_far_rms = resolve('v_far_rms')
    l_0_v_far_pk = resolve('v_far_pk')
    l_0_stack = resolve('stack')
    l_0_v_phasing_rms = resolve('v_phasing_rms')
    l_0_v_phasing_pk = resolve('v_phasing_pk')
    l_0_phasing_note = resolve('phasing_note')
    l_0_v_element_rms = resolve('v_element_rms')
    l_0_v_element_pk = resolve('v_element_pk')
    l_0_low_point = resolve('low_point')
    l_0_low_point_what = resolve('low_point_what')
    l_0_inverted = resolve('inverted')
    l_0_low_point_near = resolve('low_point_near')
    l_0_i_short = resolve('i_short')
    l_0_d_general = resolve('d_general')
    l_0_general_name = resolve('general_name')
    l_0_d_controlled = resolve('d_controlled')
    l_0_controlled_name = resolve('controlled_name')
    l_0_standard = resolve('standard')
    l_0_in_near_field = resolve('in_near_field')
    l_0_near_field = resolve('near_field')
    l_0_f0 = resolve('f0')
    l_0_hung = resolve('hung')
    l_0_vertical = resolve('vertical')
    pass
    if (undefined(name='findings') if l_0_findings is missing else l_0_findings):
        pass
        yield "## This design against the parts' ratings\n\n"
        for (l_1_part, l_1_body) in (undefined(name='findings') if l_0_findings is missing else l_0_findings):
            _loop_vars = {}
            pass
            yield '! <b>'
            yield escape(l_1_part)
            yield '.</b> '
            yield escape(l_1_body)
            yield '\n\n'
        l_1_part = l_1_body = missing
    yield '\n## Overhead power lines\n\n! <b>Contact with a power line kills.</b> Treat every overhead line, including service drops to houses, as\nlive and uninsulated. Place the whole antenna, its ropes, the coax and the supports so that nothing can\nreach a line if anything breaks, slips or falls: keep every part, and its fall zone, well clear; at the\nleast, as far from any line, measured across the ground, as the top of the antenna is high\n('
    yield escape((undefined(name='top_height') if l_0_top_height is missing else l_0_top_height))
    yield ' here), and farther where your codes say so. Never throw a line, fly a rope or raise\na support toward or near a power line.\n\n## Ladders, trees and climbing\n\nFalls are the commonest injury in antenna work. Set ladders on firm, level ground at a safe angle,\ntie them off, and keep three points of contact; do not work alone. Raise ropes over limbs with a\nthrow weight from the ground rather than climbing where you can. Do not climb trees, roofs or towers\nwithout the training, the fall protection and the permission that the work needs. Keep people out of\nthe area under anyone working overhead and under the rope while the antenna is hoisted.\n\n## High RF voltage at the open ends\n\n! <b>High voltage.</b> At '
    yield escape((undefined(name='power') if l_0_power is missing else l_0_power))
    yield ' the open end of the stub carries about '
    yield escape((undefined(name='v_open_rms') if l_0_v_open_rms is missing else l_0_v_open_rms))
    yield ' rms ('
    yield escape((undefined(name='v_open_pk') if l_0_v_open_pk is missing else l_0_v_open_pk))
    yield ' peak)\nand the far end of the radiator about '
    yield escape((undefined(name='v_far_rms') if l_0_v_far_rms is missing else l_0_v_far_rms))
    yield ' rms ('
    yield escape((undefined(name='v_far_pk') if l_0_v_far_pk is missing else l_0_v_far_pk))
    yield ' peak).'
    if (undefined(name='stack') if l_0_stack is missing else l_0_stack):
        pass
        yield ' The phasing\nstub carries high voltage too: about '
        yield escape((undefined(name='v_phasing_rms') if l_0_v_phasing_rms is missing else l_0_v_phasing_rms))
        yield ' rms ('
        yield escape((undefined(name='v_phasing_pk') if l_0_v_phasing_pk is missing else l_0_v_phasing_pk))
        yield ' peak) across its open\nend, the gap between the radiator and the upper element ('
        yield escape((undefined(name='phasing_note') if l_0_phasing_note is missing else l_0_phasing_note))
        yield "), and the upper element's\nfar end about "
        yield escape((undefined(name='v_element_rms') if l_0_v_element_rms is missing else l_0_v_element_rms))
        yield ' rms ('
        yield escape((undefined(name='v_element_pk') if l_0_v_element_pk is missing else l_0_v_element_pk))
        yield " peak); the gap insulator and the phasing stub's support must be rated\nfor it."
    yield '\n'
    if (undefined(name='stack') if l_0_stack is missing else l_0_stack):
        pass
        yield 'All these ends'
    else:
        pass
        yield 'Both ends'
    yield ' can arc to\nanything near them, burn through rope and tape, and set dry leaves alight. Keep '
    if (undefined(name='stack') if l_0_stack is missing else l_0_stack):
        pass
        yield 'them'
    else:
        pass
        yield 'both ends'
    yield ' out of reach\nof people and animals'
    if (undefined(name='low_point') if l_0_low_point is missing else l_0_low_point):
        pass
        yield ' (the lowest live point, '
        yield escape((undefined(name='low_point_what') if l_0_low_point_what is missing else l_0_low_point_what))
        yield ', is about\n'
        yield escape((undefined(name='low_point') if l_0_low_point is missing else l_0_low_point))
        yield ' above ground)'
    yield ', away from foliage and buildings, and on insulators rated\nfor the voltage.\n'
    if (undefined(name='inverted') if l_0_inverted is missing else l_0_inverted):
        pass
        yield "\n! <b>Upside down, the high-voltage end hangs low.</b> The radiator's far end is the bottom of this\nantenna, about "
        yield escape((undefined(name='low_point') if l_0_low_point is missing else l_0_low_point))
        yield ' above ground'
        if (undefined(name='low_point_near') if l_0_low_point_near is missing else l_0_low_point_near):
            pass
            yield ', near head height'
        yield ', at about '
        yield escape((undefined(name='v_far_rms') if l_0_v_far_rms is missing else l_0_v_far_rms))
        yield ' rms\n('
        yield escape((undefined(name='v_far_pk') if l_0_v_far_pk is missing else l_0_v_far_pk))
        yield ' peak). Nobody may walk under it or touch it, its tether or the ground stake while the\ntransmitter is on: fence off the ground around it or keep the end higher than anyone can reach,\nand use a non-conducting tether that stays dry.\n'
    yield '\n## RF burns\n\nNever touch the antenna, the stub, the tap or the coax braid near the tap while a transmitter is\nconnected, even at low power: an RF burn goes deep and heals slowly. The short carries about\n'
    yield escape((undefined(name='i_short') if l_0_i_short is missing else l_0_i_short))
    yield ' rms at '
    yield escape((undefined(name='power') if l_0_power is missing else l_0_power))
    yield '. Disconnect the coax at the station before every adjustment, and\ntransmit only when everybody is clear.\n\n## RF exposure\n\nKeep people at least '
    yield escape((undefined(name='d_general') if l_0_d_general is missing else l_0_d_general))
    yield ' from any part of the antenna ('
    yield escape((undefined(name='general_name') if l_0_general_name is missing else l_0_general_name))
    yield '), and at least\n'
    yield escape((undefined(name='d_controlled') if l_0_d_controlled is missing else l_0_d_controlled))
    yield ' for those who know of the exposure and can control it ('
    yield escape((undefined(name='controlled_name') if l_0_controlled_name is missing else l_0_controlled_name))
    yield '), by\nthe screening estimate under '
    yield escape((undefined(name='standard') if l_0_standard is missing else l_0_standard))
    yield ' in the performance section. These are screening figures,\nnot measurements'
    if (undefined(name='in_near_field') if l_0_in_near_field is missing else l_0_in_near_field):
        pass
        yield "; they lie inside the antenna's reactive near field (about\n"
        yield escape((undefined(name='near_field') if l_0_near_field is missing else l_0_near_field))
        yield ' at '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield '), where the far-field formula behind them does not strictly apply'
    else:
        pass
        yield ";\nthey lie beyond the antenna's reactive near field (about "
        yield escape((undefined(name='near_field') if l_0_near_field is missing else l_0_near_field))
        yield ' at '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield ')'
    yield ".\nYour regulator's rules and methods decide whether the station complies.\n\n## Lightning, grounding and disconnecting\n\nDo not work on the antenna, or stay near it, when thunder can be heard. Disconnect the coax from the\nstation when it is not in use and when storms are near, and keep the disconnected end outside or on a\ngrounded entry panel. Bond the coax braid and any arrester to the building's grounding electrode\nsystem as your electrical code requires. An arrester or a grounded coax does not make a direct strike\nsafe.\n\n## Weather and wind load\n\n"
    if (undefined(name='hung') if l_0_hung is missing else l_0_hung):
        pass
        yield "Wind makes the hung antenna swing and saws the halyard on the branch: use a pulley or a smooth sleeve\nover the branch, keep the antenna out from the trunk with the tether to a stake (or a weight that\ncan swing), leave the halyard's tie-off where you can lower it quickly, and use UV-resistant rope; a\nbranch that breaks brings everything down, so choose a sound one."
    elif (undefined(name='vertical') if l_0_vertical is missing else l_0_vertical):
        pass
        yield 'Wind loads the mast, the stub and the radiator: guy or brace the mast for the worst wind of your\nsite, check the clamps after storms, and keep the whole assembly where a fall would hit nobody.'
    else:
        pass
        yield 'Wind makes the wire and the stub swing and saws ropes on limbs and pulleys: leave slack or a\ncounterweight at one end so that the wire gives before a support breaks, tie the bottom of the stub\nloosely to a non-conducting stake, and use UV-resistant rope.'
    yield " Ice adds weight; sun degrades plastics. Inspect the antenna, the ropes, the insulators\nand the tap's weatherproofing every season and after storms; water in the coax raises the SWR.\n\n## Local codes and licensed practice come first\n\nThese cautions are a reminder, not a complete safety plan, and they do not replace local building and\nelectrical codes, your regulator's rules, the landowner's permission or licensed practice. Where they\ndiffer from this sheet, they come first. If in doubt, ask a licensed electrician, a qualified climber\nor your national amateur radio society."

blocks = {}
debug_info = '3=39&6=42&7=46&17=52&30=54&31=60&32=67&33=71&34=73&36=78&37=85&38=92&39=97&41=100&43=103&44=111&52=114&57=118&58=122&59=126&60=128&61=131&62=138&75=143&80=146'
