# exposure.j2 compiled by jinja2 3.1.6: written by sheet.write_compiled_templates(), do not edit
from jinja2.runtime import LoopContext, Macro, Markup, Namespace, TemplateNotFound, TemplateReference, TemplateRuntimeError, Undefined, escape, identity, internalcode, markup_join, missing, str_join
name = 'exposure.j2'

def root(context, missing=missing):
    resolve = context.resolve_or_missing
    undefined = environment.undefined
    concat = environment.concat
    cond_expr_undefined = Undefined
    if 0: yield None
    l_0_average = resolve('average')
    l_0_pep = resolve('pep')
    l_0_mode = resolve('mode')
    l_0_duty = resolve('duty')
    l_0_on_air = resolve('on_air')
    l_0_standard = resolve('standard')
    l_0_in_near_field = resolve('in_near_field')
    l_0_near_field = resolve('near_field')
    l_0_f0 = resolve('f0')
    pass
    yield 'The distances follow the far-field method of FCC OET Bulletin 65 with its ground-reflection factor\nof 2.56, for '
    yield escape((undefined(name='average') if l_0_average is missing else l_0_average))
    yield ' average ('
    yield escape((undefined(name='pep') if l_0_pep is missing else l_0_pep))
    yield ', '
    yield escape((undefined(name='mode') if l_0_mode is missing else l_0_mode))
    yield ' duty factor '
    yield escape((undefined(name='duty') if l_0_duty is missing else l_0_duty))
    yield ', on the air\n'
    yield escape((undefined(name='on_air') if l_0_on_air is missing else l_0_on_air))
    yield ' of the averaging time) and the '
    yield escape((undefined(name='standard') if l_0_standard is missing else l_0_standard))
    yield ' limits at the strictest frequency of the\nband. '
    if (undefined(name='in_near_field') if l_0_in_near_field is missing else l_0_in_near_field):
        pass
        yield 'They fall inside the reactive near field of the antenna (within about '
        yield escape((undefined(name='near_field') if l_0_near_field is missing else l_0_near_field))
        yield ' at\n'
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield '), where that formula does not strictly apply.'
    else:
        pass
        yield 'The reactive near field reaches about '
        yield escape((undefined(name='near_field') if l_0_near_field is missing else l_0_near_field))
        yield ' at '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield '.'
    yield " This is a screening estimate, not a measurement: defer to your regulator's rules and\nmethods for the evaluation of your station."

blocks = {}
debug_info = '3=21&4=29&5=33&6=36&7=38&9=43'
