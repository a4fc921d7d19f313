# card-tuning.j2 compiled by jinja2 3.1.6: written by sheet.write_compiled_templates(), do not edit
from jinja2.runtime import LoopContext, Macro, Markup, Namespace, TemplateNotFound, TemplateReference, TemplateRuntimeError, Undefined, escape, identity, internalcode, markup_join, missing, str_join
name = 'card-tuning.j2'

def root(context, missing=missing):
    resolve = context.resolve_or_missing
    undefined = environment.undefined
    concat = environment.concat
    cond_expr_undefined = Undefined
    if 0: yield None
    l_0_style = resolve('style')
    l_0_radiator_as_cut = resolve('radiator_as_cut')
    l_0_stub = resolve('stub')
    l_0_tap = resolve('tap')
    l_0_height = resolve('height')
    l_0_trim_step = resolve('trim_step')
    l_0_trim_step_df = resolve('trim_step_df')
    l_0_z_feed = resolve('z_feed')
    l_0_df = resolve('df')
    l_0_f0 = resolve('f0')
    l_0_radiator_move = resolve('radiator_move')
    l_0_dr = resolve('dr')
    l_0_tap_dir_high = resolve('tap_dir_high')
    l_0_tap_dir_low = resolve('tap_dir_low')
    l_0_tap_move = resolve('tap_move')
    l_0_has_radiator_margin = resolve('has_radiator_margin')
    l_0_radiator_start = resolve('radiator_start')
    l_0_radiator = resolve('radiator')
    l_0_radiator_end = resolve('radiator_end')
    l_0_open_top = resolve('open_top')
    l_0_has_stub_margin = resolve('has_stub_margin')
    l_0_stub_start = resolve('stub_start')
    l_0_short_side = resolve('short_side')
    l_0_tap_side = resolve('tap_side')
    l_0_best_swr = resolve('best_swr')
    l_0_inverted = resolve('inverted')
    l_0_radiator_noun = resolve('radiator_noun')
    l_0_dx = resolve('dx')
    l_0_short_dir_high = resolve('short_dir_high')
    l_0_short_dir_low = resolve('short_dir_low')
    l_0_short_move = resolve('short_move')
    l_0_stop_swr = resolve('stop_swr')
    l_0_dip_tolerance = resolve('dip_tolerance')
    l_0_min_move = resolve('min_move')
    l_0_big_move = resolve('big_move')
    pass
    if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'tube'):
        pass
        yield '1. Start: top '
        yield escape((undefined(name='radiator_as_cut') if l_0_radiator_as_cut is missing else l_0_radiator_as_cut))
        yield ' above the open top (as cut); short fixed '
        yield escape((undefined(name='stub') if l_0_stub is missing else l_0_stub))
        yield ' below it; tap\n   clamps '
        yield escape((undefined(name='tap') if l_0_tap is missing else l_0_tap))
        yield ' above the short; choke at the tap.\n2. Analyzer at the tap, antenna at its height ('
        yield escape((undefined(name='height') if l_0_height is missing else l_0_height))
        yield '). The short stays: trim the top for the\n   dip (each '
        yield escape((undefined(name='trim_step') if l_0_trim_step is missing else l_0_trim_step))
        yield ' off raises it '
        yield escape((undefined(name='trim_step_df') if l_0_trim_step_df is missing else l_0_trim_step_df))
        yield '), then R = '
        yield escape((undefined(name='z_feed') if l_0_z_feed is missing else l_0_z_feed))
        yield ' with the tap; log it.\n\n| you measure (up = toward the open top) | do this |\n| lowest SWR '
        yield escape((undefined(name='df') if l_0_df is missing else l_0_df))
        yield ' below '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield " | trim the long element's top by "
        yield escape((undefined(name='radiator_move') if l_0_radiator_move is missing else l_0_radiator_move))
        yield ' |\n| R '
        yield escape((undefined(name='dr') if l_0_dr is missing else l_0_dr))
        yield ' above '
        yield escape((undefined(name='z_feed') if l_0_z_feed is missing else l_0_z_feed))
        yield ' (below) | move the tap '
        yield escape((undefined(name='tap_dir_high') if l_0_tap_dir_high is missing else l_0_tap_dir_high))
        yield ' ('
        yield escape((undefined(name='tap_dir_low') if l_0_tap_dir_low is missing else l_0_tap_dir_low))
        yield ') by '
        yield escape((undefined(name='tap_move') if l_0_tap_move is missing else l_0_tap_move))
        yield ' |'
    else:
        pass
        yield '1. Start: radiator '
        yield escape(((undefined(name='radiator_start') if l_0_radiator_start is missing else l_0_radiator_start) if (undefined(name='has_radiator_margin') if l_0_has_radiator_margin is missing else l_0_has_radiator_margin) else (undefined(name='radiator') if l_0_radiator is missing else l_0_radiator)))
        yield ' from the '
        yield escape((undefined(name='radiator_end') if l_0_radiator_end is missing else l_0_radiator_end))
        yield '\n   to the '
        yield escape((undefined(name='open_top') if l_0_open_top is missing else l_0_open_top))
        yield '; short '
        yield escape(((undefined(name='stub_start') if l_0_stub_start is missing else l_0_stub_start) if (undefined(name='has_stub_margin') if l_0_has_stub_margin is missing else l_0_has_stub_margin) else (undefined(name='stub') if l_0_stub is missing else l_0_stub)))
        yield ' '
        yield escape((undefined(name='short_side') if l_0_short_side is missing else l_0_short_side))
        yield ' the '
        yield escape((undefined(name='open_top') if l_0_open_top is missing else l_0_open_top))
        if (undefined(name='has_stub_margin') if l_0_has_stub_margin is missing else l_0_has_stub_margin):
            pass
            yield ' (the long end: the tuning moves it up)'
        yield '; tap '
        yield escape(('clips' if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'twin-lead') else 'clamps'))
        yield ' '
        yield escape((undefined(name='tap') if l_0_tap is missing else l_0_tap))
        yield '\n   '
        yield escape((undefined(name='tap_side') if l_0_tap_side is missing else l_0_tap_side))
        yield ' the short; choke wound right at the tap.\n2. Analyzer at the tap, antenna at its working height ('
        yield escape((undefined(name='height') if l_0_height is missing else l_0_height))
        yield '). Sweep the band (the model puts\n   the lowest SWR at '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield ', '
        yield escape((undefined(name='best_swr') if l_0_best_swr is missing else l_0_best_swr))
        yield ':1), then at '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield ' read R and X: the target is\n   R = '
        yield escape((undefined(name='z_feed') if l_0_z_feed is missing else l_0_z_feed))
        yield ', X = 0 Ω. Correct X first with the short, then R with the tap; read again; log it.'
        if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'twin-lead'):
            pass
            yield ' Trim the top to raise the dip (each '
            yield escape((undefined(name='trim_step') if l_0_trim_step is missing else l_0_trim_step))
            yield ' off: about\n   '
            yield escape((undefined(name='trim_step_df') if l_0_trim_step_df is missing else l_0_trim_step_df))
            yield '); solder the tap when the match is made.'
        yield '\n\n| you measure (up = toward the open top'
        if (undefined(name='inverted') if l_0_inverted is missing else l_0_inverted):
            pass
            yield ', here downward'
        yield ') | do this |\n| lowest SWR '
        yield escape((undefined(name='df') if l_0_df is missing else l_0_df))
        yield ' below '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield ' (above) | shorten (lengthen) '
        yield escape((undefined(name='radiator_noun') if l_0_radiator_noun is missing else l_0_radiator_noun))
        yield ' by '
        yield escape((undefined(name='radiator_move') if l_0_radiator_move is missing else l_0_radiator_move))
        yield ' |\n| R '
        yield escape((undefined(name='dr') if l_0_dr is missing else l_0_dr))
        yield ' above '
        yield escape((undefined(name='z_feed') if l_0_z_feed is missing else l_0_z_feed))
        yield ' (below) | move the tap '
        yield escape((undefined(name='tap_dir_high') if l_0_tap_dir_high is missing else l_0_tap_dir_high))
        yield ' ('
        yield escape((undefined(name='tap_dir_low') if l_0_tap_dir_low is missing else l_0_tap_dir_low))
        yield ') by '
        yield escape((undefined(name='tap_move') if l_0_tap_move is missing else l_0_tap_move))
        yield ' |\n| X = +'
        yield escape((undefined(name='dx') if l_0_dx is missing else l_0_dx))
        yield ' (X = -'
        yield escape((undefined(name='dx') if l_0_dx is missing else l_0_dx))
        yield ') | move the short '
        yield escape((undefined(name='short_dir_high') if l_0_short_dir_high is missing else l_0_short_dir_high))
        yield ' ('
        yield escape((undefined(name='short_dir_low') if l_0_short_dir_low is missing else l_0_short_dir_low))
        yield ') by '
        yield escape((undefined(name='short_move') if l_0_short_move is missing else l_0_short_move))
        yield ', tap clamps left in place |'
    yield '\n\n! <b>Stop</b> when SWR at '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' is '
    yield escape((undefined(name='stop_swr') if l_0_stop_swr is missing else l_0_stop_swr))
    yield ':1 or lower (common practice) and the dip lies\nwithin '
    yield escape((undefined(name='dip_tolerance') if l_0_dip_tolerance is missing else l_0_dip_tolerance))
    yield ' of it, or when the next move would be under '
    yield escape((undefined(name='min_move') if l_0_min_move is missing else l_0_min_move))
    yield '. A move over\n'
    yield escape((undefined(name='big_move') if l_0_big_move is missing else l_0_big_move))
    yield ", or readings that do not follow the table: stop and check the line type, the short's\ncontact, the tap leads and the choke."

blocks = {}
debug_info = '3=46&4=49&5=53&6=55&7=57&10=63&11=69&13=82&14=86&15=93&16=101&17=103&18=105&19=111&20=113&21=118&23=121&24=125&25=133&26=143&29=154&30=158&31=162'
