/**
 * Line colours: Okabe & Ito (2008), "Color Universal Design" — eight colours told apart with every common
 * colour-vision deficiency. Yellow (#F0E442) is left out: too faint on white for a thin line.
 */
export const LINE_COLOURS = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#000000'] as const;

export const lineColour = (i: number) => LINE_COLOURS[i % LINE_COLOURS.length] as string;

/**
 * Sequential colour scale for a third channel: seven stops of viridis (van der Walt & Smith, matplotlib, 2015),
 * perceptually uniform, readable in grey and with deuteranopia, protanopia and tritanopia.
 */
export const VIRIDIS_7 = ['#440154', '#443983', '#31688e', '#21918c', '#35b779', '#8fd744', '#fde725'] as const;

/** Full-throttle pulls shaded, knock marked: a warm tint and the report's red for knock. */
export const PULL_FILL = '#E69F00';
export const KNOCK_STROKE = '#ad2318';
