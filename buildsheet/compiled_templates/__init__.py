"""The templates of templates/ compiled by jinja2 (sheet.write_compiled_templates(); do not
edit): used only for a template whose source has the SHA-256 given here, by this jinja2."""

JINJA2 = '3.1.6'
SOURCES = {
    'asbuilt.j2': '66960f6985f38d8919c402c6b0cacead5f81dec9493945fc763debc6596c0e65',
    'card-cautions.j2': 'ee3ea22b33876dd65009879e56258ede82f4d7272c1a17e26b1d47b3c5348223',
    'card-tuning.j2': '6c91995150e3eabb19c1adacb8632781bfb1a1438e0e757c9b4e225a233afc55',
    'cautions.j2': '68d072feebfde71cf801f4b52337439b5aacf84451533f91649cc8d1f73c1a07',
    'exposure.j2': '9dea8818f4846a02262669eeb99b131969a10add89b861b531d76d34852643dd',
    'handout-safety.j2': 'a97045d7044e26fd8eed6d0c90d3bf7ee9fbb94f355534919b37aac279fdecd5',
    'tuning.j2': '3b9466a00513922e11d74d30e5fa978e7bf4e985838ee11104cd1fb7be966bd5',
}
