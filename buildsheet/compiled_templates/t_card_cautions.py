# card-cautions.j2 compiled by jinja2 3.1.6: written by sheet.write_compiled_templates(), do not edit
from jinja2.runtime import LoopContext, Macro, Markup, Namespace, TemplateNotFound, TemplateReference, TemplateRuntimeError, Undefined, escape, identity, internalcode, markup_join, missing, str_join
name = 'card-cautions.j2'

def root(context, missing=missing):
    resolve = context.resolve_or_missing
    undefined = environment.undefined
    concat = environment.concat
    cond_expr_undefined = Undefined
    if 0: yield None
    l_0_top_height = resolve('top_height')
    l_0_power = resolve('power')
    l_0_v_open_pk = resolve('v_open_pk')
    l_0_v_phasing_pk = resolve('v_phasing_pk')
    l_0_v_far_pk = resolve('v_far_pk')
    l_0_low_point = resolve('low_point')
    l_0_low_point_what = resolve('low_point_what')
    l_0_where = resolve('where')
    pass
    yield "! <b>Power lines kill.</b> Keep every part of the antenna, its ropes and supports, and their fall zone,\nat least as far from any overhead line as the antenna's top is high ("
    yield escape((undefined(name='top_height') if l_0_top_height is missing else l_0_top_height))
    yield ' here), and farther\nwhere your codes say so. Never throw a rope toward a line.\n\n! <b>High RF voltage at the open ends.</b> At '
    yield escape((undefined(name='power') if l_0_power is missing else l_0_power))
    yield ': about '
    yield escape((undefined(name='v_open_pk') if l_0_v_open_pk is missing else l_0_v_open_pk))
    yield " peak at the stub's\nopen end"
    if (undefined(name='v_phasing_pk') if l_0_v_phasing_pk is missing else l_0_v_phasing_pk):
        pass
        yield ', '
        yield escape((undefined(name='v_phasing_pk') if l_0_v_phasing_pk is missing else l_0_v_phasing_pk))
        yield " across the phasing stub's gap"
    yield '\nand '
    yield escape((undefined(name='v_far_pk') if l_0_v_far_pk is missing else l_0_v_far_pk))
    if (not (undefined(name='v_phasing_pk') if l_0_v_phasing_pk is missing else l_0_v_phasing_pk)):
        pass
        yield ' peak'
    yield " at the radiator's far end. Keep "
    if (undefined(name='v_phasing_pk') if l_0_v_phasing_pk is missing else l_0_v_phasing_pk):
        pass
        yield 'all'
    else:
        pass
        yield 'both'
    yield ' out of reach'
    if (undefined(name='low_point') if l_0_low_point is missing else l_0_low_point):
        pass
        yield '\n(lowest live point: '
        yield escape((undefined(name='low_point_what') if l_0_low_point_what is missing else l_0_low_point_what))
        yield ', about '
        yield escape((undefined(name='low_point') if l_0_low_point is missing else l_0_low_point))
        yield ' up)'
    yield '; never touch the\nantenna while a transmitter is connected. Read all the safety cautions before you build ('
    yield escape((undefined(name='where') if l_0_where is missing else l_0_where))
    yield ').'

blocks = {}
debug_info = '4=20&7=22&8=26&9=32&10=47&11=52'
