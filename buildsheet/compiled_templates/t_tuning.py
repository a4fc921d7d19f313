# tuning.j2 compiled by jinja2 3.1.6: written by sheet.write_compiled_templates(), do not edit
from jinja2.runtime import LoopContext, Macro, Markup, Namespace, TemplateNotFound, TemplateReference, TemplateRuntimeError, Undefined, escape, identity, internalcode, markup_join, missing, str_join
name = 'tuning.j2'

def root(context, missing=missing):
    resolve = context.resolve_or_missing
    undefined = environment.undefined
    concat = environment.concat
    cond_expr_undefined = Undefined
    if 0: yield None
    l_0_height = resolve('height')
    l_0_style = resolve('style')
    l_0_hung = resolve('hung')
    l_0_inverted = resolve('inverted')
    l_0_vertical = resolve('vertical')
    l_0_sloper = resolve('sloper')
    l_0_stub_why = resolve('stub_why')
    l_0_has_stub_margin = resolve('has_stub_margin')
    l_0_stub_margin = resolve('stub_margin')
    l_0_radiator_why = resolve('radiator_why')
    l_0_has_radiator_margin = resolve('has_radiator_margin')
    l_0_radiator_margin = resolve('radiator_margin')
    l_0_model_limits = resolve('model_limits')
    l_0_has_as_built = resolve('has_as_built')
    l_0_as_built_date = resolve('as_built_date')
    l_0_as_built_parts = resolve('as_built_parts')
    l_0_radiator_as_cut = resolve('radiator_as_cut')
    l_0_radiator = resolve('radiator')
    l_0_trim = resolve('trim')
    l_0_trim_df = resolve('trim_df')
    l_0_f0 = resolve('f0')
    l_0_stub = resolve('stub')
    l_0_radiator_start = resolve('radiator_start')
    l_0_radiator_end = resolve('radiator_end')
    l_0_wrap = resolve('wrap')
    l_0_rigid = resolve('rigid')
    l_0_stub_start = resolve('stub_start')
    l_0_short_side = resolve('short_side')
    l_0_open_top = resolve('open_top')
    l_0_tap = resolve('tap')
    l_0_tap_side = resolve('tap_side')
    l_0_stack = resolve('stack')
    l_0_element = resolve('element')
    l_0_gap = resolve('gap')
    l_0_phasing = resolve('phasing')
    l_0_sleeve = resolve('sleeve')
    l_0_feed_length = resolve('feed_length')
    l_0_coax_matched_loss = resolve('coax_matched_loss')
    l_0_station_rows = resolve('station_rows')
    l_0_df = resolve('df')
    l_0_radiator_is = resolve('radiator_is')
    l_0_short_moves_dip = resolve('short_moves_dip')
    l_0_shorten_radiator = resolve('shorten_radiator')
    l_0_radiator_move = resolve('radiator_move')
    l_0_short_dip_dir_low = resolve('short_dip_dir_low')
    l_0_short_dip_move = resolve('short_dip_move')
    l_0_lengthen_radiator = resolve('lengthen_radiator')
    l_0_short_dip_dir_high = resolve('short_dip_dir_high')
    l_0_dip_tolerance = resolve('dip_tolerance')
    l_0_stop_swr_station = resolve('stop_swr_station')
    l_0_tap_move = resolve('tap_move')
    l_0_z_feed = resolve('z_feed')
    l_0_stop_swr = resolve('stop_swr')
    l_0_best_swr = resolve('best_swr')
    l_0_swr2_band = resolve('swr2_band')
    l_0_x_slope = resolve('x_slope')
    l_0_x_if_grows = resolve('x_if_grows')
    l_0_x_if_shrinks = resolve('x_if_shrinks')
    l_0_stub_travel = resolve('stub_travel')
    l_0_radiator_travel = resolve('radiator_travel')
    l_0_rounding = resolve('rounding')
    l_0_dr = resolve('dr')
    l_0_tap_dir_high = resolve('tap_dir_high')
    l_0_tap_dir_low = resolve('tap_dir_low')
    l_0_dx = resolve('dx')
    l_0_short_dir_high = resolve('short_dir_high')
    l_0_short_move = resolve('short_move')
    l_0_short_dir_low = resolve('short_dir_low')
    l_0_trim_step = resolve('trim_step')
    l_0_trim_step_df = resolve('trim_step_df')
    l_0_min_move = resolve('min_move')
    l_0_big_move = resolve('big_move')
    pass
    yield 'There are two ways to tune: with an SWR meter (or an analyzer) at the station end of the feed coax,\nwhich tells where the dip lies and how deep it is, or with an antenna analyzer at the tap, which also\ntells R and X and so which part to move. Both use the moves of the table under "What to change". Never\nadjust anything while a transmitter is connected.\n\n## Working from the ground\n\nTake every reading with the antenna at its working height ('
    yield escape((undefined(name='height') if l_0_height is missing else l_0_height))
    yield '): the ground, the support and\nthe coax near the antenna all change the readings, so a reading taken low does not hold once the\nantenna is raised. '
    if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'twin-lead'):
        pass
        yield "Make the changes with the line let down on its halyard,\nso that the short, the tap and the radiator's top come within reach, and hoist it again before the\nnext reading."
    elif ((undefined(name='hung') if l_0_hung is missing else l_0_hung) and (undefined(name='inverted') if l_0_inverted is missing else l_0_inverted)):
        pass
        yield "To make a change, untie the tether and lower the antenna on\nits halyard until the short and the tap, at its top, are within reach (the radiator lies along the\nground; to change the radiator's length, its far end is at the bottom); mark the halyard first, so\nthat after the move you hoist it back to the same mark ("
        yield escape((undefined(name='height') if l_0_height is missing else l_0_height))
        yield ' to the short) and tie the tether\nagain before the next reading.'
    elif (undefined(name='hung') if l_0_hung is missing else l_0_hung):
        pass
        yield "To make a change, untie the tether and lower the antenna on\nits halyard: the short and the tap, at the bottom, come within reach first; lower it all the way to\nreach the radiator's top. Mark the halyard first, so that after the move you hoist it back to the\nsame mark ("
        yield escape((undefined(name='height') if l_0_height is missing else l_0_height))
        yield ' to the short) and tie the tether again before the next reading.'
    elif (undefined(name='inverted') if l_0_inverted is missing else l_0_inverted):
        pass
        yield "Make\nthe changes with the mast tilted over or lowered, so that the short and the tap, at the top of the\nantenna, and the radiator's far end, at its bottom, come within reach, and raise it again before the\nnext reading."
    elif (undefined(name='vertical') if l_0_vertical is missing else l_0_vertical):
        pass
        yield "Make the changes with the mast tilted over or lowered, so that the\nshort, the tap and the radiator's top come within reach, and raise it again before the next\nreading."
    else:
        pass
        yield "Make the changes on the ground: lower the stub's open top on its rope until the short\nand the tap are within reach ("
        if (undefined(name='sloper') if l_0_sloper is missing else l_0_sloper):
            pass
            yield "the sloper's far end may stay tied"
        else:
            pass
            yield "let the\nradiator's far end down too, or slack it on its rope"
        yield '), make the move, and hoist it again\nbefore the next reading.'
    yield ' Make the final check with everything in place, as it will be used.\n\n## How far the first cut may be off\n\n'
    yield escape((undefined(name='stub_why') if l_0_stub_why is missing else l_0_stub_why))
    if (undefined(name='has_stub_margin') if l_0_has_stub_margin is missing else l_0_has_stub_margin):
        pass
        yield ' So the stub line is cut '
        yield escape((undefined(name='stub_margin') if l_0_stub_margin is missing else l_0_stub_margin))
        yield ' long (the tuning\nmargin in the cut list) and the short starts at the long end: from there the tuning moves it up,\nand line that was cut too short cannot be put back.'
    yield '\n\n'
    yield escape((undefined(name='radiator_why') if l_0_radiator_why is missing else l_0_radiator_why))
    if (undefined(name='has_radiator_margin') if l_0_has_radiator_margin is missing else l_0_has_radiator_margin):
        pass
        yield ' So the radiator is cut '
        yield escape((undefined(name='radiator_margin') if l_0_radiator_margin is missing else l_0_radiator_margin))
        yield ' long (the\ntuning margin in the cut list) and first hung at the long end: from there the tuning '
        if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'twin-lead'):
            pass
            yield 'trims its top, and line that was cut too short cannot be put back'
        else:
            pass
            yield 'takes wire up\ninto the wrap, and wire that was cut too short cannot be put back'
        yield '.'
    yield '\n'
    for l_1_limit in (undefined(name='model_limits') if l_0_model_limits is missing else l_0_model_limits):
        _loop_vars = {}
        pass
        yield '\nModel limit: '
        yield escape(l_1_limit)
        yield '\n'
    l_1_limit = missing
    yield '\n## Starting positions\n'
    if (undefined(name='has_as_built') if l_0_has_as_built is missing else l_0_has_as_built):
        pass
        yield "\nAs built (the record's entry of "
        yield escape((undefined(name='as_built_date') if l_0_as_built_date is missing else l_0_as_built_date))
        yield '): '
        yield escape((undefined(name='as_built_parts') if l_0_as_built_parts is missing else l_0_as_built_parts))
        yield ". That is the antenna the\nnext readings are taken on: make the table's moves from these positions, not from the design's below,\nand record the new positions after each change (`buildsheet record`), so that `buildsheet fit` starts\nfrom them too.\n"
    yield '\n\n'
    if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'tube'):
        pass
        yield '1. Long element: as cut, its top '
        yield escape((undefined(name='radiator_as_cut') if l_0_radiator_as_cut is missing else l_0_radiator_as_cut))
        yield " above the stub's open top (the "
        yield escape((undefined(name='radiator') if l_0_radiator is missing else l_0_radiator))
        yield '\n   solved plus the '
        yield escape((undefined(name='trim') if l_0_trim is missing else l_0_trim))
        yield ' trimming allowance), the open top being level with the top of the short\n   stub conductor. The allowance puts the first dip about '
        yield escape((undefined(name='trim_df') if l_0_trim_df is missing else l_0_trim_df))
        yield ' below '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield ': expect to trim\n   it off in steps.\n2. Short: fixed by the pieces, its centre line '
        yield escape((undefined(name='stub') if l_0_stub is missing else l_0_stub))
        yield " below the open top. It is not moved in\n   tuning: the tap and the long element's top are."
    else:
        pass
        yield '1. Radiator: '
        if (undefined(name='has_radiator_margin') if l_0_has_radiator_margin is missing else l_0_has_radiator_margin):
            pass
            yield escape((undefined(name='radiator_start') if l_0_radiator_start is missing else l_0_radiator_start))
            yield ' (the '
            yield escape((undefined(name='radiator') if l_0_radiator is missing else l_0_radiator))
            yield ' solved plus the\n   '
            yield escape((undefined(name='radiator_margin') if l_0_radiator_margin is missing else l_0_radiator_margin))
            yield ' tuning margin)'
        else:
            pass
            yield escape((undefined(name='radiator') if l_0_radiator is missing else l_0_radiator))
        yield ' from the '
        yield escape((undefined(name='radiator_end') if l_0_radiator_end is missing else l_0_radiator_end))
        yield '\n   to '
        if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'twin-lead'):
            pass
            yield 'the gap'
        else:
            pass
            yield "the junction at the stub's open top"
        if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'twin-lead'):
            pass
            yield " (the gap in the other conductor is the junction; the line's top\n   is tied "
            yield escape((undefined(name='wrap') if l_0_wrap is missing else l_0_wrap))
            yield " above the radiator's top end)."
        elif (undefined(name='rigid') if l_0_rigid is missing else l_0_rigid):
            pass
            yield ' (the cut list allows '
            yield escape((undefined(name='wrap') if l_0_wrap is missing else l_0_wrap))
            yield ' at each end for cutting).'
        else:
            pass
            yield ', with the wraps made (the cut list allows '
            yield escape((undefined(name='wrap') if l_0_wrap is missing else l_0_wrap))
            yield ' at each end).'
        yield '\n2. Short: its centre line '
        if (undefined(name='has_stub_margin') if l_0_has_stub_margin is missing else l_0_has_stub_margin):
            pass
            yield escape((undefined(name='stub_start') if l_0_stub_start is missing else l_0_stub_start))
            yield ' '
            yield escape((undefined(name='short_side') if l_0_short_side is missing else l_0_short_side))
            yield ' the '
            yield escape((undefined(name='open_top') if l_0_open_top is missing else l_0_open_top))
            yield ' (the\n   '
            yield escape((undefined(name='stub') if l_0_stub is missing else l_0_stub))
            yield ' solved plus the '
            yield escape((undefined(name='stub_margin') if l_0_stub_margin is missing else l_0_stub_margin))
            yield ' tuning margin: the long end)'
        else:
            pass
            yield escape((undefined(name='stub') if l_0_stub is missing else l_0_stub))
            yield '\n   '
            yield escape((undefined(name='short_side') if l_0_short_side is missing else l_0_short_side))
            yield ' the '
            yield escape((undefined(name='open_top') if l_0_open_top is missing else l_0_open_top))
        yield ', measured along the stub.'
    yield '\n3. Tap: the '
    yield escape(('clips' if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'twin-lead') else 'clamps'))
    yield ' '
    yield escape((undefined(name='tap') if l_0_tap is missing else l_0_tap))
    yield ' '
    yield escape((undefined(name='tap_side') if l_0_tap_side is missing else l_0_tap_side))
    yield ' the centre line of the short, centre conductor of the coax to the\n   conductor the radiator hangs on, braid to the other.\n'
    if (undefined(name='stack') if l_0_stack is missing else l_0_stack):
        pass
        yield '5. Upper element and phasing stub: the element '
        yield escape((undefined(name='element') if l_0_element is missing else l_0_element))
        yield ' end to end, in line above the\n   radiator with a '
        yield escape((undefined(name='gap') if l_0_gap is missing else l_0_gap))
        yield " gap held by the insulator; the phasing stub's conductors from the\n   radiator's end and from the element's start, its short's centre line "
        yield escape((undefined(name='phasing') if l_0_phasing is missing else l_0_phasing))
        yield " out from the\n   gap. These are cut to the sheet and are not tuning points: tune with the short and the tap as\n   below. If the radiator must be trimmed, trim the upper element by the same amount. The tables'\n   element moves are the model's; NEC-2 moves the dip 1.3 to 1.8 times as far per trim on the\n   stacked designs checked, so trim half the move first and read again.\n"
    if (undefined(name='sleeve') if l_0_sleeve is missing else l_0_sleeve):
        pass
        yield '4. Choke: the sleeve slid over the coax with its open end right at the tap, its far end bonded to\n   the braid, trimmed to resonance first as in the choke detail.'
    else:
        pass
        yield '4. Choke: wound as in the choke detail, right at the tap.'
    yield '\n\n## With an SWR meter at the transmitter\n\nConnect the meter at the station end of the feed coax ('
    yield escape((undefined(name='feed_length') if l_0_feed_length is missing else l_0_feed_length))
    yield "), with the transmitter at low\npower or an analyzer in its place. The coax's loss ("
    yield escape((undefined(name='coax_matched_loss') if l_0_coax_matched_loss is missing else l_0_coax_matched_loss))
    yield ' dB matched at '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ')\nweakens the reflected wave both on the way up and on the way back, so the SWR at the station reads\nlower than at the tap; it does not move the dip. For the design as cut the model expects:\n\n| frequency | SWR at the station | SWR at the tap |\n'
    for (l_1_f, l_1_tx, l_1_tap) in (undefined(name='station_rows') if l_0_station_rows is missing else l_0_station_rows):
        _loop_vars = {}
        pass
        yield '| '
        yield escape(l_1_f)
        yield ' | '
        yield escape(l_1_tx)
        yield ' | '
        yield escape(l_1_tap)
        yield ' |\n'
    l_1_f = l_1_tx = l_1_tap = missing
    yield '\nSweep or step across the band, note the frequency of lowest SWR (the dip) and how low it goes, and read\nthe pattern:\n\n| your readings | what it means | do this |\n| lowest SWR '
    yield escape((undefined(name='df') if l_0_df is missing else l_0_df))
    yield ' below '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ', rising toward the top of the band | the dip is low: '
    yield escape((undefined(name='radiator_is') if l_0_radiator_is is missing else l_0_radiator_is))
    yield ' long'
    if (undefined(name='short_moves_dip') if l_0_short_moves_dip is missing else l_0_short_moves_dip):
        pass
        yield ' or the short is too low'
    yield ' | '
    yield escape((undefined(name='shorten_radiator') if l_0_shorten_radiator is missing else l_0_shorten_radiator))
    yield ' by '
    yield escape((undefined(name='radiator_move') if l_0_radiator_move is missing else l_0_radiator_move))
    if (undefined(name='short_moves_dip') if l_0_short_moves_dip is missing else l_0_short_moves_dip):
        pass
        yield ', or move the short '
        yield escape((undefined(name='short_dip_dir_low') if l_0_short_dip_dir_low is missing else l_0_short_dip_dir_low))
        yield ' by '
        yield escape((undefined(name='short_dip_move') if l_0_short_dip_move is missing else l_0_short_dip_move))
    yield '; half the error, half the move |\n| lowest SWR '
    yield escape((undefined(name='df') if l_0_df is missing else l_0_df))
    yield ' above '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ', rising toward the bottom of the band | the dip is high: '
    yield escape((undefined(name='radiator_is') if l_0_radiator_is is missing else l_0_radiator_is))
    yield ' short'
    if (undefined(name='short_moves_dip') if l_0_short_moves_dip is missing else l_0_short_moves_dip):
        pass
        yield ' or the short is too high'
    yield ' | '
    yield escape((undefined(name='lengthen_radiator') if l_0_lengthen_radiator is missing else l_0_lengthen_radiator))
    yield ' by '
    yield escape((undefined(name='radiator_move') if l_0_radiator_move is missing else l_0_radiator_move))
    if (undefined(name='short_moves_dip') if l_0_short_moves_dip is missing else l_0_short_moves_dip):
        pass
        yield ', or move the short '
        yield escape((undefined(name='short_dip_dir_high') if l_0_short_dip_dir_high is missing else l_0_short_dip_dir_high))
        yield ' by '
        yield escape((undefined(name='short_dip_move') if l_0_short_dip_move is missing else l_0_short_dip_move))
    yield "; half the error, half the move |\n| flat and high everywhere, no dip in the band | the dip lies outside the band, or nothing reaches the antenna | step beyond the band edges to find the dip; with no dip anywhere, check the coax and its plugs, the choke, the tap leads and the short's contact |\n| dip within "
    yield escape((undefined(name='dip_tolerance') if l_0_dip_tolerance is missing else l_0_dip_tolerance))
    yield ' of '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ', lowest SWR above '
    yield escape((undefined(name='stop_swr_station') if l_0_stop_swr_station is missing else l_0_stop_swr_station))
    yield ' | the match is off: R or X at the tap is wrong | move the tap by '
    yield escape((undefined(name='tap_move') if l_0_tap_move is missing else l_0_tap_move))
    yield ' one way and read again; if the lowest SWR rose, move it back past where it started by '
    yield escape((undefined(name='tap_move') if l_0_tap_move is missing else l_0_tap_move))
    yield ' the other way |\n\nSWR alone cannot tell whether R at the tap lies above or below '
    yield escape((undefined(name='z_feed') if l_0_z_feed is missing else l_0_z_feed))
    yield ', nor the sign of X: that is\nwhy the last row tries one way first. An analyzer at the tap (below) settles it with one reading.\nStop when the SWR at the station reads '
    yield escape((undefined(name='stop_swr_station') if l_0_stop_swr_station is missing else l_0_stop_swr_station))
    yield ':1 or lower at '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' (that is\n'
    yield escape((undefined(name='stop_swr') if l_0_stop_swr is missing else l_0_stop_swr))
    yield ':1 at the tap through this coax) and the dip lies within '
    yield escape((undefined(name='dip_tolerance') if l_0_dip_tolerance is missing else l_0_dip_tolerance))
    yield ' of it.\n\n## With an analyzer at the tap\n\nConnect the analyzer at the tap, through the short pigtail of the choke, not at the station end of the\nlong feed coax: the coax transforms R and X, so only readings at the tap compare with the numbers\nbelow.\n\n1. Sweep across the band and note the frequency of lowest SWR (the dip). The model predicts the dip\n   at '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' with SWR '
    yield escape((undefined(name='best_swr') if l_0_best_swr is missing else l_0_best_swr))
    yield ':1, and SWR below 2:1 from '
    yield escape((undefined(name='swr2_band') if l_0_swr2_band is missing else l_0_swr2_band))
    yield '.\n2. Set the analyzer to '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' and read R and X. The target is R = '
    yield escape((undefined(name='z_feed') if l_0_z_feed is missing else l_0_z_feed))
    yield ' and X = 0 Ω.\n3. If your analyzer shows X without its sign: step the frequency up a little. Near '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield " this\n   design's X "
    yield escape((undefined(name='x_slope') if l_0_x_slope is missing else l_0_x_slope))
    yield ' with frequency, so if |X| grows as you step up, X is '
    yield escape((undefined(name='x_if_grows') if l_0_x_if_grows is missing else l_0_x_if_grows))
    yield '; if\n   it shrinks, X is '
    yield escape((undefined(name='x_if_shrinks') if l_0_x_if_shrinks is missing else l_0_x_if_shrinks))
    yield '.\n4. Write every reading and every change in the measurement log.'
    if ((undefined(name='has_stub_margin') if l_0_has_stub_margin is missing else l_0_has_stub_margin) or (undefined(name='has_radiator_margin') if l_0_has_radiator_margin is missing else l_0_has_radiator_margin)):
        pass
        yield '\n5. Started long, the first readings will usually call for '
        if (undefined(name='has_stub_margin') if l_0_has_stub_margin is missing else l_0_has_stub_margin):
            pass
            yield 'moving the short\n   up (by up to '
            yield escape((undefined(name='stub_travel') if l_0_stub_travel is missing else l_0_stub_travel))
            yield ' in all)'
        if ((undefined(name='has_stub_margin') if l_0_has_stub_margin is missing else l_0_has_stub_margin) and (undefined(name='has_radiator_margin') if l_0_has_radiator_margin is missing else l_0_has_radiator_margin)):
            pass
            yield ' and\n   '
        if (undefined(name='has_radiator_margin') if l_0_has_radiator_margin is missing else l_0_has_radiator_margin):
            pass
            yield 'shortening the radiator by taking up wire (up to\n   '
            yield escape((undefined(name='radiator_travel') if l_0_radiator_travel is missing else l_0_radiator_travel))
            yield ' in all)'
        yield ': make the moves the table gives, a step at a time, and\n   measure again after each.'
    yield "\n\n## What to change\n\nThe moves below come from this design's model ("
    yield escape((undefined(name='rounding') if l_0_rounding is missing else l_0_rounding))
    yield '). They scale in proportion: half the\nerror, half the move. Up means toward the open top, down toward the short'
    if (undefined(name='inverted') if l_0_inverted is missing else l_0_inverted):
        pass
        yield ' (on this\nupside-down antenna, "up" toward the open top is toward the ground)'
    yield '.\n\n| you measure | do this |\n| lowest SWR '
    yield escape((undefined(name='df') if l_0_df is missing else l_0_df))
    yield ' below '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' | '
    yield escape((undefined(name='shorten_radiator') if l_0_shorten_radiator is missing else l_0_shorten_radiator))
    yield ' by '
    yield escape((undefined(name='radiator_move') if l_0_radiator_move is missing else l_0_radiator_move))
    if (undefined(name='short_moves_dip') if l_0_short_moves_dip is missing else l_0_short_moves_dip):
        pass
        yield ', or move the short '
        yield escape((undefined(name='short_dip_dir_low') if l_0_short_dip_dir_low is missing else l_0_short_dip_dir_low))
        yield ' by '
        yield escape((undefined(name='short_dip_move') if l_0_short_dip_move is missing else l_0_short_dip_move))
    yield ' |\n| lowest SWR '
    yield escape((undefined(name='df') if l_0_df is missing else l_0_df))
    yield ' above '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' | '
    yield escape((undefined(name='lengthen_radiator') if l_0_lengthen_radiator is missing else l_0_lengthen_radiator))
    yield ' by '
    yield escape((undefined(name='radiator_move') if l_0_radiator_move is missing else l_0_radiator_move))
    if (undefined(name='short_moves_dip') if l_0_short_moves_dip is missing else l_0_short_moves_dip):
        pass
        yield ', or move the short '
        yield escape((undefined(name='short_dip_dir_high') if l_0_short_dip_dir_high is missing else l_0_short_dip_dir_high))
        yield ' by '
        yield escape((undefined(name='short_dip_move') if l_0_short_dip_move is missing else l_0_short_dip_move))
    yield ' |\n| R '
    yield escape((undefined(name='dr') if l_0_dr is missing else l_0_dr))
    yield ' above '
    yield escape((undefined(name='z_feed') if l_0_z_feed is missing else l_0_z_feed))
    yield ' at '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' | move the tap '
    yield escape((undefined(name='tap_dir_high') if l_0_tap_dir_high is missing else l_0_tap_dir_high))
    yield ' by '
    yield escape((undefined(name='tap_move') if l_0_tap_move is missing else l_0_tap_move))
    yield ' |\n| R '
    yield escape((undefined(name='dr') if l_0_dr is missing else l_0_dr))
    yield ' below '
    yield escape((undefined(name='z_feed') if l_0_z_feed is missing else l_0_z_feed))
    yield ' at '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' | move the tap '
    yield escape((undefined(name='tap_dir_low') if l_0_tap_dir_low is missing else l_0_tap_dir_low))
    yield ' by '
    yield escape((undefined(name='tap_move') if l_0_tap_move is missing else l_0_tap_move))
    yield ' |\n'
    if ((undefined(name='style') if l_0_style is missing else l_0_style) != 'tube'):
        pass
        yield '| X = +'
        yield escape((undefined(name='dx') if l_0_dx is missing else l_0_dx))
        yield ' at '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield ' | move the short '
        yield escape((undefined(name='short_dir_high') if l_0_short_dir_high is missing else l_0_short_dir_high))
        yield ' by '
        yield escape((undefined(name='short_move') if l_0_short_move is missing else l_0_short_move))
        yield ', tap clamps left in place |\n| X = -'
        yield escape((undefined(name='dx') if l_0_dx is missing else l_0_dx))
        yield ' at '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield ' | move the short '
        yield escape((undefined(name='short_dir_low') if l_0_short_dir_low is missing else l_0_short_dir_low))
        yield ' by '
        yield escape((undefined(name='short_move') if l_0_short_move is missing else l_0_short_move))
        yield ', tap clamps left in place |\n'
    yield '\n'
    if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'tube'):
        pass
        yield '1. The short is fixed on this build (soldered or bolted): put the dip on '
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield " by trimming the\n   long element's top, which also brings X at "
        yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
        yield ' near 0, then R with the tap; read both again\n   after each move.'
    else:
        pass
        yield '1. Correct X first with the short, then R with the tap, then read both again: each move changes the\n   other reading a little.'
    yield '\n2. With an SWR meter only, put the dip on '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' with the '
    yield escape(('short (or the radiator)' if (undefined(name='short_moves_dip') if l_0_short_moves_dip is missing else l_0_short_moves_dip) else ("long element's top" if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'tube') else 'radiator')))
    yield ', then\n   bring the lowest SWR down with the tap (see above). With an analyzer, trim the radiator only when\n   the dip stays more than '
    yield escape((undefined(name='dip_tolerance') if l_0_dip_tolerance is missing else l_0_dip_tolerance))
    yield ' from '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' after the match is made.'
    if (undefined(name='short_moves_dip') if l_0_short_moves_dip is missing else l_0_short_moves_dip):
        pass
        yield ' Each move in the first two rows shifts the dip by about '
        yield escape((undefined(name='df') if l_0_df is missing else l_0_df))
        yield ' on its\n   own; make one of them, not both, and measure again.'
    elif ((undefined(name='style') if l_0_style is missing else l_0_style) == 'tube'):
        pass
    else:
        pass
        yield ' On this design the short cannot\n   move the dip far without spoiling the match (moving it also shortens the tap distance): use the\n   radiator for the dip, and the short for X.'
    if ((undefined(name='style') if l_0_style is missing else l_0_style) == 'tube'):
        pass
        yield '\n3. The long element cannot be lengthened: it is cut '
        yield escape((undefined(name='trim') if l_0_trim is missing else l_0_trim))
        yield ' long, so trim its top in small steps;\n   each '
        yield escape((undefined(name='trim_step') if l_0_trim_step is missing else l_0_trim_step))
        yield ' trimmed off raises the dip by about '
        yield escape((undefined(name='trim_step_df') if l_0_trim_step_df is missing else l_0_trim_step_df))
        yield '. Cut too short, a\n   sliding sleeve at its top puts length back. Cap the tops when the tuning is done.'
    elif ((undefined(name='style') if l_0_style is missing else l_0_style) == 'twin-lead'):
        pass
        yield '\n3. The radiator cannot be lengthened: it is first hung long, so trim its top end (and tie it again)\n   in small steps; each '
        yield escape((undefined(name='trim_step') if l_0_trim_step is missing else l_0_trim_step))
        yield ' trimmed off raises the dip by about '
        yield escape((undefined(name='trim_step_df') if l_0_trim_step_df is missing else l_0_trim_step_df))
        yield '. The\n   short moves up by soldering a new link higher and cutting the line below it; try the tap with the\n   crocodile clips and solder it when the match is made.'
    elif (undefined(name='rigid') if l_0_rigid is missing else l_0_rigid):
        pass
        yield '\n3. A pipe or rod radiator cannot be lengthened by unwrapping: cut it long, trim it in small steps, or\n   fit a sliding sleeve at its top.'
    else:
        pass
        yield '\n3. To lengthen the radiator, let out wire from the wrap at its '
        yield escape(('top' if (undefined(name='vertical') if l_0_vertical is missing else l_0_vertical) else 'far'))
        yield ' end;\n   to shorten it, take up more wire in the wrap rather than cutting, until the tuning is done.'
    yield '\n\n## When to stop\n\nStop when SWR at '
    yield escape((undefined(name='f0') if l_0_f0 is missing else l_0_f0))
    yield ' is '
    yield escape((undefined(name='stop_swr') if l_0_stop_swr is missing else l_0_stop_swr))
    yield ':1 or lower (common practice) and the dip lies within\n'
    yield escape((undefined(name='dip_tolerance') if l_0_dip_tolerance is missing else l_0_dip_tolerance))
    yield ' of it, or when the next move would be smaller than '
    yield escape((undefined(name='min_move') if l_0_min_move is missing else l_0_min_move))
    yield '. If a move comes\nout larger than '
    yield escape((undefined(name='big_move') if l_0_big_move is missing else l_0_big_move))
    yield ", or the readings do not follow the table, something else is wrong:\ncheck the line type, the short's contact, the tap leads, the choke and the measured lengths before\nmoving anything further."

blocks = {}
debug_info = '10=84&12=86&14=89&17=92&18=94&21=97&24=102&27=108&33=116&37=123&38=129&41=137&42=141&45=145&46=148&52=153&53=156&54=160&55=162&57=166&60=171&61=177&62=185&63=191&64=194&65=196&66=204&67=207&68=215&69=223&71=228&73=234&74=239&75=241&80=243&85=250&86=252&91=256&92=260&98=268&99=288&101=308&103=318&105=320&106=324&115=328&116=334&117=338&118=340&119=344&121=346&122=349&123=352&124=357&125=360&131=364&132=366&136=370&137=384&138=398&139=408&140=418&141=421&142=429&144=438&145=441&146=443&152=449&154=453&155=457&156=462&159=467&160=470&161=472&163=476&165=479&168=483&172=489&178=492&179=496&180=500'
