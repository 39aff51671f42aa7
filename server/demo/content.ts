/**
 * What the demo's marketer has written and photographed: a tasting note for every product, an
 * introduction for every flight, and what each photo shows (the pictures themselves are drawn by
 * server/demo/pictures.ts). All invented for Larmoir, like the venue. Kept short, so a six-pour
 * card still fits one page.
 */

/** Published tasting notes (Markdown), by product code (server/demo/data.ts). */
export const DEMO_NOTES: Record<string, string> = {
  'SV-CID-21': 'Windfall apples pressed in October and left to go **bone dry**:\n\n- green apple skin\n- a salty, chalky finish',
  'SV-SPK-22': 'Eighteen months on its lees: fine bubbles, **toasted oat** and lemon peel.',
  'SV-ALB-24': 'Grown two fields from the shore. White peach, **sea spray** and a bitter-almond edge.',
  'SV-CF-23': 'Light on its feet: red currant, **crushed leaf** and a cool, graphite finish.',
  'SV-FOR-19': 'Fortified at the first hint of sweetness:\n\n1. Black cherry and fig\n2. **Cocoa** and a long, warm close',
  'SV-GIN-07': 'Samphire from the marsh at low tide, juniper and **bog myrtle**. Try a drop of water.',
}

/** Published flight introductions (Markdown), by flight name (server/demo/data.ts). */
export const DEMO_INTROS: Record<string, string> = {
  'Shoreline Flight': 'From the orchard behind the barn to the still by the quay, in six small glasses.\n\nYour host pours **one glass at a time** and tells you what to watch for on its wall. Water is on the table; take your time.',
  'After Dark (in the works)': 'Three **darker** pours for the evening: the red, the fortified red and a small gin to end on.',
}

/** The hero photo of the room and each product's photo: what a screen reader hears. */
export const DEMO_PHOTO_ALT = {
  room: 'The tasting bar at dusk: six glasses in a row on the counter, from pale cider to dark red, with the salt marsh through the window behind',
  products: {
    'SV-CID-21': 'A brown cider bottle with a cream label beside a tumbler of pale gold cider',
    'SV-SPK-22': 'A dark green sparkling-wine bottle with gold foil beside a flute of straw-coloured wine',
    'SV-ALB-24': 'A tall pale-green wine bottle beside a tulip glass of pale white wine',
    'SV-CF-23': 'A dark wine bottle with a terracotta label beside a tulip glass of red wine',
    'SV-FOR-19': 'A short, round dark bottle beside a small glass of deep ruby fortified wine',
    'SV-GIN-07': 'A square clear gin bottle with a sea-green label beside a nosing glass of clear gin',
  } as Record<string, string>,
}
