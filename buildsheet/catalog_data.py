"""data/catalog.yaml as read by catalog._read, as Python literals: written by catalog.write_catalog_data()
(do not edit; used only while SHA256 is that of data/catalog.yaml)."""

SHA256 = 'bde399448c8baf1a7548f262ca19823f240c835b9ede3366484ad93d19f34719'

DATA = {'materials': {'copper': {'conductivity': '5.8001e7 S/m',
                          'source': 'IACS annealed copper standard, 100 % IACS = 1/(1.7241e-8 ohm '
                                    'm); from memory (CHECK_VALUES constants, [M]).'},
               'copper-clad-steel': {'conductivity': '5.8001e7 S/m',
                                     'source': 'From memory: at RF the current flows in the copper '
                                               'skin when the cladding is several skin depths '
                                               'thick (copper: 49 µm at 1.8 MHz, 17.7 µm at 14 '
                                               "MHz), so copper's conductivity is used. Thin-clad "
                                               'or stranded CCS loses more than this at the low HF '
                                               'bands.'},
               'aluminium': {'conductivity': '3.538e7 S/m',
                             'source': 'EC-grade (1350) aluminium conductor, 61.0 % IACS; from '
                                       'memory. Alloy antenna wire is lower (down to about 30 % '
                                       'IACS).'},
               'bronze': {'conductivity': '8.70e6 S/m',
                          'source': 'Phosphor-bronze antenna wire, about 15 % IACS; from memory. '
                                    'Other bronzes differ widely.'}},
 'insulation': {'bare': {'velocity_factor': 1.0,
                         'source': "No jacket; the wire's own end effect is left to the radiator "
                                   'model.'},
                'pvc': {'velocity_factor': 0.96,
                        'source': 'Common practice, from memory: a thin jacket makes a wire '
                                  'antenna resonate about 2-5 % short; 0.96 is a typical figure '
                                  'for PVC (eps_r about 3-4) on house or hook-up wire. Not a '
                                  'measured value for any particular wire; `buildsheet fit` '
                                  'corrects it from a measured sweep.',
                        'velocity_factor_spread': [0.95, 0.98],
                        'spread_source': 'From memory, common practice (not confirmed in a stored '
                                         'text): jacketed wire antennas are reported about 2-5 % '
                                         'short of bare wire, the thicker and the more lossy the '
                                         'PVC the shorter.'},
                'polyethylene': {'velocity_factor': 0.97,
                                 'source': 'Common practice, from memory: polyethylene (eps_r '
                                           '2.25) shortens a wire less than PVC; 0.97 is a typical '
                                           'figure for a thin jacket. Not measured; `buildsheet '
                                           'fit` corrects it.',
                                 'velocity_factor_spread': [0.96, 0.98],
                                 'spread_source': 'From memory, common practice (not confirmed in '
                                                  'a stored text): a thin polyethylene jacket '
                                                  'shortens a wire antenna about 2-4 %.'}},
 'dielectrics': {'air': {'eps_r': 1.0,
                         'tan_delta': 0.0,
                         'source': 'Dry air is eps_r 1.0006 (from memory); 1 is used because the '
                                   "0.03 % it moves Z0 is far below any line's tolerance."},
                 'polyethylene': {'eps_r': 2.25,
                                  'tan_delta': 0.0002,
                                  'source': 'Solid polyethylene, typical values from memory; '
                                            '1/sqrt(2.25) = 0.667 matches the 0.66 velocity factor '
                                            'of solid-PE coax ([S], CHECK_VALUES §7).'},
                 'ptfe': {'eps_r': 2.1,
                          'tan_delta': 0.0002,
                          'source': 'PTFE, typical values from memory.'},
                 'pvc': {'eps_r': 3.5,
                         'tan_delta': 0.02,
                         'source': 'PVC, typical values from memory; both vary widely with '
                                   'plasticiser and frequency (eps_r about 3-5, tan_delta '
                                   '0.01-0.05 at HF).'}},
 'stub_lines': {'window-450': {'kind': 'nominal',
                               'z0': '400 ohm',
                               'velocity_factor': 0.902,
                               'loss_db_per_100ft': [['50 MHz', 0.33]],
                               'spacing': '25 mm',
                               'conductor': '18 AWG',
                               'conductor_material': 'copper-clad-steel',
                               'dielectric': 'polyethylene',
                               'source': '"450 ohm" window line measures Z0 360-400 ohm and VF '
                                         '0.902-0.930 depending on the conductor (18 AWG solid CCS '
                                         '0.902, 16 AWG stranded 0.918, 14 AWG stranded 0.930): '
                                         'measurements posted Feb 2017, (stored public text) '
                                         '(CHECK_VALUES §7). The values here are those given there '
                                         'for the common 18 AWG solid CCS line (Z0 400 ohm, VF '
                                         '0.902). Matched loss 0.33 dB/100 ft at 50 MHz for that '
                                         'line: published bench measurements of amateur balanced '
                                         'lines (1999), as tabulated in (stored public text). '
                                         'Spacing about 1 in: typical, from memory.',
                               'note': 'Sold as 450 ohm; it measures about 400 ohm. Loss is for '
                                       'clean, dry line; wet or dirty line loses several times '
                                       'more. VF falls and |Z0| rises toward the low HF bands.',
                               'velocity_factor_spread': [0.902, 0.93],
                               'spread_source': '[S] measured across conductors: 18 AWG solid CCS '
                                                '0.902, 16 AWG stranded 0.918, 14 AWG stranded '
                                                '0.930 (measurements posted Feb 2017, CHECK_VALUES '
                                                '§7). Which of these a roll is, and its VF at the '
                                                'design frequency, is not known until it is '
                                                'measured.'},
                'twinlead-300': {'kind': 'nominal',
                                 'z0': '300 ohm',
                                 'velocity_factor': 0.81,
                                 'loss_db_per_100ft': [['100 MHz', 1.1]],
                                 'spacing': '8 mm',
                                 'conductor': '20 AWG',
                                 'conductor_material': 'copper',
                                 'dielectric': 'polyethylene',
                                 'source': "Z0 300 ohm is the trade's nominal figure; VF 0.80-0.82 "
                                           'from memory ([M], CHECK_VALUES §7), 0.81 taken. Loss: '
                                           "a cable maker's catalogue figure for 20 AWG 300 ohm "
                                           'line, 1.1 dB/100 ft at 100 MHz, quoted in [S] stored '
                                           'public text (stored public text) Spacing and conductor '
                                           'typical, from memory.',
                                 'note': 'Flat TV ribbon; its impedance shifts when wet or near '
                                         'metal.',
                                 'velocity_factor_spread': [0.8, 0.82],
                                 'spread_source': 'From memory ([M], not confirmed in a stored '
                                                  'text, CHECK_VALUES §7): 300 ohm twin-lead is '
                                                  'quoted at 0.80-0.82.'},
                'window-450-14': {'kind': 'nominal',
                                  'z0': '380 ohm',
                                  'velocity_factor': 0.93,
                                  'loss_db_per_100ft': [['50 MHz', 0.33]],
                                  'spacing': '25 mm',
                                  'conductor': '14 AWG',
                                  'conductor_material': 'copper',
                                  'dielectric': 'polyethylene',
                                  'source': 'The heavier make of "450 ohm" window line, 14 AWG '
                                            'stranded copper: VF 0.930 measured [S] (measurements '
                                            'posted Feb 2017, CHECK_VALUES §7); the same '
                                            'measurements give Z0 360-400 ohm for the window lines '
                                            'as a group, and 380 ohm (mid-range) is taken for this '
                                            'one, which has the thicker conductors (lower Z0 at '
                                            "the same spacing). Loss taken as the 18 AWG line's "
                                            '0.33 dB/100 ft at 50 MHz (heavier conductors lose a '
                                            'little less: conservative). Spacing about 1 in: '
                                            'typical, from memory.',
                                  'note': 'Sold as 450 ohm; it measures about 380 ohm. Loss is for '
                                          'clean, dry line; wet or dirty line loses several times '
                                          'more.',
                                  'velocity_factor_spread': [0.918, 0.93],
                                  'spread_source': '[S] measured across conductors (CHECK_VALUES '
                                                   '§7): 16 AWG stranded 0.918, 14 AWG stranded '
                                                   '0.930. Which the roll is, is not known until '
                                                   'it is measured.'},
                'window-300-18': {'kind': 'nominal',
                                  'z0': '300 ohm',
                                  'velocity_factor': 0.88,
                                  'loss_db_per_100ft': [['50 MHz', 0.5]],
                                  'spacing': '9 mm',
                                  'conductor': '18 AWG',
                                  'conductor_material': 'copper-clad-steel',
                                  'dielectric': 'polyethylene',
                                  'source': 'From memory, not confirmed in a stored text: 300 ohm '
                                            'window line with 18 AWG solid copper-clad-steel '
                                            'conductors about 9 mm apart, velocity factor about '
                                            '0.88, matched loss about 0.5 dB/100 ft at 50 MHz. Z0 '
                                            "300 ohm is the trade's nominal figure.",
                                  'note': 'Velocity factor from memory only: measure the roll (a '
                                          'shorted length and an analyzer) before cutting the stub '
                                          'to its final length.',
                                  'velocity_factor_spread': [0.85, 0.91],
                                  'spread_source': 'From memory, not confirmed: 300 ohm window '
                                                   'lines are quoted between about 0.85 and 0.91.'},
                'window-300-20': {'kind': 'nominal',
                                  'z0': '300 ohm',
                                  'velocity_factor': 0.88,
                                  'loss_db_per_100ft': [['50 MHz', 0.55]],
                                  'spacing': '7.5 mm',
                                  'conductor': '20 AWG',
                                  'conductor_material': 'copper',
                                  'dielectric': 'polyethylene',
                                  'source': 'From memory, not confirmed in a stored text: the '
                                            'lighter make of 300 ohm window line, 20 AWG stranded '
                                            'copper about 7.5 mm apart, velocity factor about '
                                            '0.88, matched loss about 0.55 dB/100 ft at 50 MHz. Z0 '
                                            "300 ohm is the trade's nominal figure.",
                                  'note': 'Velocity factor from memory only: measure the roll '
                                          'before cutting the stub to its final length.',
                                  'velocity_factor_spread': [0.85, 0.91],
                                  'spread_source': 'From memory, not confirmed: 300 ohm window '
                                                   'lines are quoted between about 0.85 and 0.91.'},
                'open-wire-600': {'kind': 'geometry',
                                  'spacing': '6 in',
                                  'conductor': '12 AWG',
                                  'conductor_material': 'copper',
                                  'dielectric': 'air',
                                  'source': 'Common practice: 12 AWG copper at 6 in spacing is the '
                                            'classic home-made 600 ohm open-wire line (120 '
                                            'acosh(D/d) = 600.07 ohm, CHECK_VALUES §1a).',
                                  'note': 'Spreaders lower the VF slightly (open-wire line '
                                          'measures "0.975 or higher", [S] CHECK_VALUES §7); the '
                                          'model treats the line as air-spaced.',
                                  'velocity_factor_spread': [0.975, 1.0],
                                  'spread_source': '[S] open-wire line with spreaders measures '
                                                   '"0.975 or higher" (CHECK_VALUES §7); 1.0 is '
                                                   "the limit of air-spaced line as the spreaders' "
                                                   'share of the length goes to nothing '
                                                   '(physics).'}},
 'coax': {'RG-58': {'z0': '50 ohm',
                    'velocity_factor': 0.66,
                    'outer_diameter': '4.95 mm',
                    'inner_diameter': '0.81 mm',
                    'dielectric_diameter': '2.95 mm',
                    'loss_db_per_100ft': [['30 MHz', 2.47], ['150 MHz', 5.63]],
                    'source': 'Loss: handbook table (the correction to Table 6-1 of the General '
                              "Class License Manual, values from a cable maker's data), [S] "
                              'CHECK_VALUES §6c. VF 0.66 solid PE: [S] coaxial cable specification '
                              'sheet, CHECK_VALUES §7. Outer diameter nominal, from memory ([M], '
                              'CHECK_VALUES §4). Inner conductor (0.81 mm solid) and dielectric '
                              '(2.95 mm) diameters: typical RG-58/U construction, from memory.'},
          'RG-8X': {'z0': '50 ohm',
                    'velocity_factor': 0.8,
                    'outer_diameter': '6.1 mm',
                    'loss_db_per_100ft': [['30 MHz', 1.96], ['150 MHz', 4.53]],
                    'source': 'Loss: handbook table (the correction to Table 6-1 of the General '
                              "Class License Manual, values from a cable maker's data), [S] "
                              'CHECK_VALUES §6c. VF 0.78-0.82 foam PE from memory ([M], '
                              'CHECK_VALUES §7), 0.80 taken. Outer diameter nominal, from memory '
                              '([M], CHECK_VALUES §4).'},
          'RG-213': {'z0': '50 ohm',
                     'velocity_factor': 0.66,
                     'outer_diameter': '10.3 mm',
                     'inner_diameter': '2.26 mm',
                     'dielectric_diameter': '7.25 mm',
                     'loss_db_per_100ft': [['30 MHz', 1.08], ['150 MHz', 2.53]],
                     'source': 'Loss: handbook table (the correction to Table 6-1 of the General '
                               "Class License Manual, values from a cable maker's data), [S] "
                               'CHECK_VALUES §6c. VF 0.66 solid PE: [S] coaxial cable '
                               'specification sheet, CHECK_VALUES §7. Outer diameter nominal, from '
                               'memory ([M], CHECK_VALUES §4). Inner conductor (7 strands of 0.75 '
                               'mm, 2.26 mm over the strands) and dielectric (7.25 mm) diameters: '
                               'typical RG-213/U construction, from memory.'},
          'foam-400': {'z0': '50 ohm',
                       'velocity_factor': 0.85,
                       'outer_diameter': '10.3 mm',
                       'inner_diameter': '2.74 mm',
                       'dielectric_diameter': '7.24 mm',
                       'loss_db_per_100ft': [['30 MHz', 0.7], ['150 MHz', 1.5], ['450 MHz', 2.7]],
                       'source': 'LMR-400 class low-loss foam-dielectric coax (0.405 in over the '
                                 'jacket, solid copper-clad aluminium centre, foil and braid). All '
                                 "figures from memory of makers' published datasheets, not checked "
                                 'against a stored copy: VF 0.85, loss 0.7 / 1.5 / 2.7 dB/100 ft '
                                 'at 30 / 150 / 450 MHz, centre 2.74 mm, dielectric 7.24 mm. '
                                 'Foam-PE coax in general measures VF 0.78-0.84 ([S] CHECK_VALUES '
                                 '§7); this class is quoted a little higher.',
                       'note': 'Stiff; needs its own connectors and a choke form of at least 10 '
                               'times its diameter.'},
          'RG-6': {'z0': '75 ohm',
                   'velocity_factor': 0.85,
                   'outer_diameter': '6.9 mm',
                   'inner_diameter': '1.02 mm',
                   'dielectric_diameter': '4.57 mm',
                   'loss_db_per_100ft': [['50 MHz', 1.4], ['400 MHz', 4.3]],
                   'source': 'RG-6 75 ohm foam-dielectric TV coax (18 AWG copper-clad-steel '
                             "centre). All figures from memory of typical makers' data, not "
                             'checked against a stored copy: VF 0.85, loss 1.4 and 4.3 dB/100 ft '
                             'at 50 and 400 MHz, centre 1.02 mm, dielectric 4.57 mm, 6.9 mm over '
                             'the jacket. The steel centre loses more than this below a few MHz '
                             '(its copper skin is thin).',
                   'note': '75 ohm; match the tap to 75 ohm (the default with this coax) and '
                           'expect SWR 1.5 on a 50 ohm meter.'}},
 'stock': [{'name': '1/2 in copper pipe',
            'kind': 'tube',
            'system': 'imperial',
            'outer_diameter': '0.625 in',
            'source': 'ASTM B88 copper water tube: outside diameter = nominal size + 1/8 in (type '
                      'M, L, K alike); from memory'},
           {'name': '3/4 in copper pipe',
            'kind': 'tube',
            'system': 'imperial',
            'outer_diameter': '0.875 in',
            'source': 'ASTM B88 copper water tube, nominal + 1/8 in; from memory'},
           {'name': '1 in copper pipe',
            'kind': 'tube',
            'system': 'imperial',
            'outer_diameter': '1.125 in',
            'source': 'ASTM B88 copper water tube, nominal + 1/8 in; from memory'},
           {'name': '3/8 in aluminium tube',
            'kind': 'tube',
            'system': 'imperial',
            'outer_diameter': '0.375 in',
            'source': 'aluminium tube is sold by outside diameter in 1/8 in steps; common '
                      'practice, from memory'},
           {'name': '1/2 in aluminium tube',
            'kind': 'tube',
            'system': 'imperial',
            'outer_diameter': '0.5 in',
            'source': 'aluminium tube sold by outside diameter; common practice, from memory'},
           {'name': '5/8 in aluminium tube',
            'kind': 'tube',
            'system': 'imperial',
            'outer_diameter': '0.625 in',
            'source': 'aluminium tube sold by outside diameter; common practice, from memory'},
           {'name': '3/4 in aluminium tube',
            'kind': 'tube',
            'system': 'imperial',
            'outer_diameter': '0.75 in',
            'source': 'aluminium tube sold by outside diameter; common practice, from memory'},
           {'name': '1 in aluminium tube',
            'kind': 'tube',
            'system': 'imperial',
            'outer_diameter': '1.0 in',
            'source': 'aluminium tube sold by outside diameter; common practice, from memory'},
           {'name': '15 mm copper tube',
            'kind': 'tube',
            'system': 'metric',
            'outer_diameter': '15 mm',
            'source': 'EN 1057 copper tube, sold by outside diameter; from memory'},
           {'name': '22 mm copper tube',
            'kind': 'tube',
            'system': 'metric',
            'outer_diameter': '22 mm',
            'source': 'EN 1057 copper tube, sold by outside diameter; from memory'},
           {'name': '28 mm copper tube',
            'kind': 'tube',
            'system': 'metric',
            'outer_diameter': '28 mm',
            'source': 'EN 1057 copper tube, sold by outside diameter; from memory'},
           {'name': '10 mm aluminium tube',
            'kind': 'tube',
            'system': 'metric',
            'outer_diameter': '10 mm',
            'source': 'aluminium tube sold by outside diameter in whole mm; common practice, from '
                      'memory'},
           {'name': '12 mm aluminium tube',
            'kind': 'tube',
            'system': 'metric',
            'outer_diameter': '12 mm',
            'source': 'common practice, from memory'},
           {'name': '16 mm aluminium tube',
            'kind': 'tube',
            'system': 'metric',
            'outer_diameter': '16 mm',
            'source': 'common practice, from memory'},
           {'name': '20 mm aluminium tube',
            'kind': 'tube',
            'system': 'metric',
            'outer_diameter': '20 mm',
            'source': 'common practice, from memory'},
           {'name': '25 mm aluminium tube',
            'kind': 'tube',
            'system': 'metric',
            'outer_diameter': '25 mm',
            'source': 'common practice, from memory'},
           {'name': '1/8 in rod',
            'kind': 'rod',
            'system': 'imperial',
            'outer_diameter': '0.125 in',
            'source': 'brass, copper and aluminium rod sold in 1/16 in steps; common practice, '
                      'from memory'},
           {'name': '3/16 in rod',
            'kind': 'rod',
            'system': 'imperial',
            'outer_diameter': '0.1875 in',
            'source': 'common practice, from memory'},
           {'name': '1/4 in rod',
            'kind': 'rod',
            'system': 'imperial',
            'outer_diameter': '0.25 in',
            'source': 'common practice, from memory'},
           {'name': '5/16 in rod',
            'kind': 'rod',
            'system': 'imperial',
            'outer_diameter': '0.3125 in',
            'source': 'common practice, from memory'},
           {'name': '3/8 in rod',
            'kind': 'rod',
            'system': 'imperial',
            'outer_diameter': '0.375 in',
            'source': 'common practice, from memory'},
           {'name': '3 mm rod',
            'kind': 'rod',
            'system': 'metric',
            'outer_diameter': '3 mm',
            'source': 'brass, copper and aluminium rod sold in whole mm; common practice, from '
                      'memory'},
           {'name': '4 mm rod',
            'kind': 'rod',
            'system': 'metric',
            'outer_diameter': '4 mm',
            'source': 'common practice, from memory'},
           {'name': '5 mm rod',
            'kind': 'rod',
            'system': 'metric',
            'outer_diameter': '5 mm',
            'source': 'common practice, from memory'},
           {'name': '6 mm rod',
            'kind': 'rod',
            'system': 'metric',
            'outer_diameter': '6 mm',
            'source': 'common practice, from memory'},
           {'name': '8 mm rod',
            'kind': 'rod',
            'system': 'metric',
            'outer_diameter': '8 mm',
            'source': 'common practice, from memory'},
           {'name': '10 mm rod',
            'kind': 'rod',
            'system': 'metric',
            'outer_diameter': '10 mm',
            'source': 'common practice, from memory'}],
 'grounds': {'free-space': {'kind': 'free-space',
                            'source': 'No ground (an antenna far above any ground); a modelling '
                                      'reference, not a site.'},
             'perfect': {'kind': 'perfect',
                         'source': 'Perfectly conducting ground plane (image theory); a modelling '
                                   'reference, not a site.'},
             'poor': {'kind': 'real',
                      'permittivity': 13,
                      'conductivity': '0.002 S/m',
                      'source': '"Rocky soil, steep hills" (eps_r 12-14, 0.002 S/m, rated poor) in '
                                'the table "Conductivity and Dielectric Constants for Common Types '
                                'of Earth", [S] stored public text (stored public text) its '
                                'primary source was not retrieved.'},
             'average': {'kind': 'real',
                         'permittivity': 13,
                         'conductivity': '0.005 S/m',
                         'source': '"Pastoral, medium hills and forestation, heavy clay soil" (13, '
                                   '0.005 S/m, rated average) in the table "Conductivity and '
                                   'Dielectric Constants for Common Types of Earth", [S] stored '
                                   'public text (stored public text) its primary source was not '
                                   'retrieved.'},
             'very-good': {'kind': 'real',
                           'permittivity': 20,
                           'conductivity': '0.0303 S/m',
                           'source': '"Pastoral, low hills, rich soil" (20, 0.0303 S/m, rated very '
                                     'good) in the table "Conductivity and Dielectric Constants '
                                     'for Common Types of Earth", [S] stored public text (stored '
                                     'public text) its primary source was not retrieved.'},
             'sea-water': {'kind': 'real',
                           'permittivity': 81,
                           'conductivity': '5.0 S/m',
                           'source': 'Salt water (81, 5.0 S/m) in the table "Conductivity and '
                                     'Dielectric Constants for Common Types of Earth", (stored '
                                     'public text)'}},
 'modes': {'ssb': {'duty_factor': '20 %',
                   'source': 'Conversational SSB without speech processing, 20 % ([S], '
                             'CHECK_VALUES §5b); with processing the same table gives 40 %.'},
           'cw': {'duty_factor': '40 %', 'source': 'CW, 40 % ([S], CHECK_VALUES §5b).'},
           'fm': {'duty_factor': '100 %', 'source': 'FM, 100 % ([S], CHECK_VALUES §5b).'},
           'digital': {'duty_factor': '100 %',
                       'source': 'RTTY/FSK, AFSK and other carrier-like modes, 100 % ([S], '
                                 'CHECK_VALUES §5b). One stored source gives 50 % for FT8/FT4; 100 '
                                 '% is the conservative choice.'}},
 'bands': [{'name': '160 m',
            'regions': {1: ['1810 kHz', '1850 kHz'],
                        2: ['1800 kHz', '2000 kHz'],
                        3: ['1800 kHz', '2000 kHz']},
            'source': 'ITU Radio Regulations Art. 5, from memory. Region 1: 1850-2000 kHz is '
                      'amateur only in some countries by footnote.'},
           {'name': '80 m',
            'regions': {1: ['3500 kHz', '3800 kHz'],
                        2: ['3500 kHz', '4000 kHz'],
                        3: ['3500 kHz', '3900 kHz']},
            'source': 'ITU Radio Regulations Art. 5, from memory.'},
           {'name': '60 m',
            'regions': {1: ['5351.5 kHz', '5366.5 kHz'],
                        2: ['5351.5 kHz', '5366.5 kHz'],
                        3: ['5351.5 kHz', '5366.5 kHz']},
            'source': 'ITU Radio Regulations Art. 5, secondary allocation made at WRC-15, from '
                      'memory. Many countries authorise channels or a wider segment instead.'},
           {'name': '40 m',
            'regions': {1: ['7000 kHz', '7200 kHz'],
                        2: ['7000 kHz', '7300 kHz'],
                        3: ['7000 kHz', '7200 kHz']},
            'source': 'ITU Radio Regulations Art. 5 (7100-7200 kHz added in Regions 1 and 3 by '
                      'WRC-03), from memory.'},
           {'name': '30 m',
            'regions': {1: ['10100 kHz', '10150 kHz'],
                        2: ['10100 kHz', '10150 kHz'],
                        3: ['10100 kHz', '10150 kHz']},
            'source': 'ITU Radio Regulations Art. 5, secondary, from memory.'},
           {'name': '20 m',
            'regions': {1: ['14000 kHz', '14350 kHz'],
                        2: ['14000 kHz', '14350 kHz'],
                        3: ['14000 kHz', '14350 kHz']},
            'source': 'ITU Radio Regulations Art. 5, from memory.'},
           {'name': '17 m',
            'regions': {1: ['18068 kHz', '18168 kHz'],
                        2: ['18068 kHz', '18168 kHz'],
                        3: ['18068 kHz', '18168 kHz']},
            'source': 'ITU Radio Regulations Art. 5, from memory.'},
           {'name': '15 m',
            'regions': {1: ['21000 kHz', '21450 kHz'],
                        2: ['21000 kHz', '21450 kHz'],
                        3: ['21000 kHz', '21450 kHz']},
            'source': 'ITU Radio Regulations Art. 5, from memory.'},
           {'name': '12 m',
            'regions': {1: ['24890 kHz', '24990 kHz'],
                        2: ['24890 kHz', '24990 kHz'],
                        3: ['24890 kHz', '24990 kHz']},
            'source': 'ITU Radio Regulations Art. 5, from memory.'},
           {'name': '10 m',
            'regions': {1: ['28.0 MHz', '29.7 MHz'],
                        2: ['28.0 MHz', '29.7 MHz'],
                        3: ['28.0 MHz', '29.7 MHz']},
            'source': 'ITU Radio Regulations Art. 5, from memory.'},
           {'name': '6 m',
            'regions': {1: ['50 MHz', '52 MHz'], 2: ['50 MHz', '54 MHz'], 3: ['50 MHz', '54 MHz']},
            'source': 'ITU Radio Regulations Art. 5, from memory. Region 1: 50-52 MHz secondary '
                      'since WRC-19 (50-54 MHz in some countries by footnote).'},
           {'name': '4 m',
            'regions': {1: ['70.0 MHz', '70.5 MHz']},
            'source': 'Not an ITU allocation: national allocations in some Region 1 countries '
                      '(e.g. 70.0-70.5 MHz in the United Kingdom), from memory. Check the national '
                      'table before building.'},
           {'name': '2 m',
            'regions': {1: ['144 MHz', '146 MHz'],
                        2: ['144 MHz', '148 MHz'],
                        3: ['144 MHz', '148 MHz']},
            'source': 'ITU Radio Regulations Art. 5, from memory.'},
           {'name': '1.25 m',
            'regions': {2: ['220 MHz', '225 MHz']},
            'source': 'ITU Radio Regulations Art. 5, Region 2 only, from memory.',
            'national': {'US': {'edges': ['222 MHz', '225 MHz'],
                                'source': '47 CFR 97.301(a): 1.25 m, 222-225 MHz in ITU Region 2 '
                                          '(219-220 MHz is for point-to-point digital message '
                                          'forwarding only), [S] stored copies of the rule as '
                                          'revised 1 Oct 2009 and 1 Sep 2021 (hallikainen.org FCC '
                                          'rules archive, 97.301).'}}},
           {'name': '70 cm',
            'regions': {1: ['430 MHz', '440 MHz'],
                        2: ['430 MHz', '440 MHz'],
                        3: ['430 MHz', '440 MHz']},
            'source': 'ITU Radio Regulations Art. 5 (secondary in Regions 2 and 3), from memory. '
                      'The USA authorises 420-450 MHz (`country: US`, below).',
            'national': {'US': {'edges': ['420 MHz', '450 MHz'],
                                'source': '47 CFR 97.301(a), the table of authorized bands, 70 cm '
                                          'in ITU Region 2: 420-450 MHz, [S] stored copies of the '
                                          'rule as revised 1 Oct 2009 and 1 Sep 2021 '
                                          '(hallikainen.org FCC rules archive, 97.301).'}}}],
 'ratings': {'coax': {'RG-58': {'power': [['10 MHz', '870 W'],
                                          ['30 MHz', '500 W'],
                                          ['150 MHz', '220 W'],
                                          ['450 MHz', '125 W']],
                                'power_source': 'Average power, matched line, about 40 °C ambient. '
                                                "From memory: makers' tables give RG-58 roughly "
                                                '500 W at 30 MHz; the other points scale that by '
                                                'the matched loss (CHECK_VALUES §6c fit), since '
                                                'the rating is thermal (the heat the cable can '
                                                'shed per metre is fixed).',
                                'working_voltage_rms': 1400,
                                'voltage_source': 'MIL-C-17 "engineering working voltage" 1400 V '
                                                  'rms for RG-58 (slash sheet MIL-C-17/28C), [S] a '
                                                  'stored list post quoting the specification '
                                                  '(TowerTalk, 28 Apr 2004).'},
                      'RG-8X': {'power': [['10 MHz', '1400 W'],
                                          ['30 MHz', '800 W'],
                                          ['150 MHz', '350 W'],
                                          ['450 MHz', '190 W']],
                                'power_source': 'Average power, matched line, about 40 °C ambient. '
                                                "From memory: makers' tables give braid-shielded "
                                                'foam RG-8X roughly 800 W at 30 MHz; the other '
                                                'points scale that by the matched loss '
                                                '(CHECK_VALUES §6c fit).',
                                'working_voltage_rms': 600,
                                'voltage_source': 'From memory: RG-8X (foam dielectric, no '
                                                  'military slash sheet) is commonly rated 300-600 '
                                                  'V rms by its makers; 600 V rms taken.'},
                      'RG-213': {'power': [['10 MHz', '3500 W'],
                                           ['30 MHz', '2000 W'],
                                           ['150 MHz', '850 W'],
                                           ['450 MHz', '465 W']],
                                 'power_source': 'Average power, matched line, about 40 °C '
                                                 "ambient. From memory: makers' tables give RG-213 "
                                                 'roughly 2 kW at 30 MHz; the other points scale '
                                                 'that by the matched loss (CHECK_VALUES §6c fit).',
                                 'working_voltage_rms': 3700,
                                 'voltage_source': 'MIL-C-17 "engineering working voltage" 3700 V '
                                                   'rms for RG-213 (slash sheet MIL-C-17/74C), [S] '
                                                   'a stored list post quoting the specification '
                                                   '(TowerTalk, 28 Apr 2004).'}},
             'connectors': {'UHF': {'label': 'UHF (PL-259 plug, SO-239 socket)',
                                    'working_voltage_peak': 500,
                                    'max_frequency': '300 MHz',
                                    'source': "500 V peak: the UHF connector's usual rating, [S] "
                                              'stored copies of the encyclopaedia article "UHF '
                                              'connector" (which also notes it is not '
                                              'constant-impedance and is reliable to about 100 '
                                              'MHz, one test finding it harmless to 435 MHz). Use '
                                              'up to 300 MHz: common practice.'},
                            'N': {'label': 'type N',
                                  'working_voltage_peak': 1000,
                                  'max_frequency': '11 GHz',
                                  'source': 'From memory: type N connectors are commonly rated '
                                            '1000 V peak working (1500 V rms withstanding); '
                                            'constant impedance, used where the UHF connector is '
                                            'not (common practice).'}},
             'stub_lines': {'window-450': {'working_voltage_peak': 10000,
                                           'power': '3 kW',
                                           'source': 'From memory: makers of window line rate it '
                                                     'by power (a few kW at HF, matched) and '
                                                     'rarely by voltage; 10 kV peak between the '
                                                     "conductors is this catalogue's working "
                                                     'figure for clean, dry line on its 1 in '
                                                     'spacing. Wet or dirty line tracks over the '
                                                     'web at far less.'},
                            'twinlead-300': {'working_voltage_peak': 2000,
                                             'power': '200 W',
                                             'source': 'From memory: flat TV ribbon is made for '
                                                       'receiving and carries no transmitting '
                                                       'rating; amateur practice keeps it to a few '
                                                       'hundred watts. 2 kV peak across its 8 mm '
                                                       "web and 200 W average are this catalogue's "
                                                       'working figures.'}},
             'corona': {'surface_factor': 0.8,
                        'source': "Peek's visual corona gradient for parallel wires, g = 30 m δ (1 "
                                  '+ 0.301/sqrt(δ r)) kV/cm peak (F. W. Peek, Dielectric Phenomena '
                                  'in High-Voltage Engineering, 1929), from memory; m = 0.8 for '
                                  'weathered or stranded wire (smooth polished wire 1.0), from '
                                  'memory. RF corona can start lower than this power-frequency law '
                                  'says; the margin of the checks is meant to cover that.'},
             'insulators': {'end': {'label': 'end insulator, ceramic or glass-filled plastic, 100 '
                                             'mm (4 in) or longer',
                                    'working_voltage_peak': 10000,
                                    'source': 'From memory: makers of antenna end ("dogbone") '
                                              'insulators about 100 mm long quote working voltages '
                                              'of the order of 10 kV; a longer or ribbed insulator '
                                              'takes more, a wet or dirty one less.'},
                            'standoff': {'label': 'stand-off insulator, 50 mm (2 in) or longer',
                                         'working_voltage_peak': 5000,
                                         'source': 'From memory: small stand-off insulators about '
                                                   '50 mm long are quoted at a few kV; 5 kV peak '
                                                   'taken.'}},
             'wire_current': [['20 AWG', 11],
                              ['18 AWG', 16],
                              ['16 AWG', 22],
                              ['14 AWG', 32],
                              ['12 AWG', 41],
                              ['10 AWG', 55],
                              ['8 AWG', 73]],
             'wire_current_source': 'The chassis-wiring column of the usual AWG ampacity table '
                                    '(single conductor in free air), from memory; amperes at DC.'},
 'coax_jackets': {'RG-58': {'braid_diameter': '3.6 mm',
                            'material': 'pvc',
                            'source': 'From memory: RG-58 is about 2.95 mm over the dielectric and '
                                      '3.6 mm over the braid under its 4.95 mm PVC jacket; makers '
                                      'differ by a few tenths of a millimetre.'},
                  'RG-8X': {'braid_diameter': '4.6 mm',
                            'material': 'pvc',
                            'source': 'From memory: RG-8X is about 3.9 mm over its foam dielectric '
                                      'and 4.6 mm over the braid under its 6.1 mm PVC jacket; '
                                      'makers differ by a few tenths of a millimetre.'},
                  'RG-213': {'braid_diameter': '8.3 mm',
                             'material': 'pvc',
                             'source': 'From memory: RG-213 is 7.24 mm over the dielectric and '
                                       'about 8.3 mm over the braid under its 10.3 mm PVC jacket '
                                       '(non-contaminating PVC); makers differ by a few tenths of '
                                       'a millimetre.'}}}
