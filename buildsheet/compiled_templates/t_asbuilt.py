# asbuilt.j2 compiled by jinja2 3.1.6: written by sheet.write_compiled_templates(), do not edit
from jinja2.runtime import LoopContext, Macro, Markup, Namespace, TemplateNotFound, TemplateReference, TemplateRuntimeError, Undefined, escape, identity, internalcode, markup_join, missing, str_join
name = 'asbuilt.j2'

def root(context, missing=missing):
    resolve = context.resolve_or_missing
    undefined = environment.undefined
    concat = environment.concat
    cond_expr_undefined = Undefined
    if 0: yield None
    l_0_entries = resolve('entries')
    pass
    if (undefined(name='entries') if l_0_entries is missing else l_0_entries):
        pass
        yield "Each entry of the design file's record beside the prediction; the difference from the design is in\nbrackets. Add an entry after every change with buildsheet record, so that this sheet and the design\nfile keep the antenna's history together."
    else:
        pass
        yield "No as-built entries yet. Write the finished antenna's dimensions and measurements in the blank rows\nbelow, then add them to the design file's record with buildsheet record, so that the next sheet prints\nthem beside the prediction."

blocks = {}
debug_info = '2=12'
