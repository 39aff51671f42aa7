import { CARD_MARGIN_PT } from '#shared/cards'
import { CARD_PAPER_POINTS, type CardPaper } from '#shared/paper'

/**
 * A card print page's paper and Print button: the @page rule follows the chosen paper (its size,
 * and the PDF's margin), and print() is bound in Vue, since the page's content security policy runs
 * no inline script (an onclick attribute would do nothing).
 */
export function useCardPrint(initial: CardPaper | undefined) {
  // The venue's paper (from its country, or the manager's choice) until the host picks another.
  const paper = ref<CardPaper>(initial ?? 'a5')
  useHead({ style: [{ key: 'card-page', innerHTML: () => `@page { size: ${CARD_PAPER_POINTS[paper.value].css}; margin: ${CARD_MARGIN_PT}pt; }` }] })
  return { paper, print: () => window.print() }
}
