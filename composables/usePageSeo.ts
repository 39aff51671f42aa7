import type { MaybeRefOrGetter } from 'vue'
import type { ShownImage } from '#shared/types/content'
import { jsonLdText } from '#shared/seo'

/** Widest image a link preview asks for, px (common practice for large preview cards, no source). */
const PREVIEW_WIDTH = 1200

/**
 * The site's public address, from the server's runtime config (NUXT_APP_URL), carried to the
 * browser in the page's state so that links built after navigation match the server's.
 */
export function useSiteUrl(): string {
  return useState<string>('site-url', () => (import.meta.server ? useRuntimeConfig().appUrl : window.location.origin)).value
}

/**
 * The absolute address of an uploaded image as link previews and schema.org read it: a JPEG (which
 * every preview reads) at most PREVIEW_WIDTH wide, through the same /media route as the pages.
 */
export function useImageAddress() {
  const site = useSiteUrl()
  const img = useImage()
  return (p: ShownImage) => {
    const width = Math.min(PREVIEW_WIDTH, p.width)
    return { url: new URL(img(p.src, { width, format: 'jpeg' }), site).toString(), width, height: Math.round(p.height * width / p.width) }
  }
}

/**
 * A public page's title, description and link preview: Open Graph and Twitter-card tags with an
 * absolute image address (the page's own photo, else the venue's), and the canonical address.
 */
export function usePageSeo(opts: { title: MaybeRefOrGetter<string>, description: MaybeRefOrGetter<string>, image?: MaybeRefOrGetter<ShownImage | null | undefined>, type?: 'website' | 'article' }) {
  const site = useSiteUrl()
  const route = useRoute()
  const imageAddress = useImageAddress()
  const { data: venue } = useVenue()
  const { data: venuePhoto } = useVenuePhoto()
  const url = computed(() => new URL(route.path, site).toString())
  const photo = computed(() => toValue(opts.image) ?? venuePhoto.value.photo)
  const preview = computed(() => (photo.value ? { ...imageAddress(photo.value), alt: photo.value.altText } : null))
  const title = () => toValue(opts.title)
  const description = () => toValue(opts.description)
  useHead({ title, link: [{ rel: 'canonical', href: url }] })
  useSeoMeta({
    description,
    ogTitle: title,
    ogDescription: description,
    ogType: opts.type ?? 'website',
    ogUrl: url,
    ogSiteName: () => venue.value?.name ?? 'Larmoir',
    ogLocale: () => (venue.value?.locale ?? 'en-US').replace('-', '_'),
    ogImage: () => preview.value?.url,
    ogImageType: () => (preview.value ? 'image/jpeg' : undefined),
    ogImageWidth: () => preview.value?.width,
    ogImageHeight: () => preview.value?.height,
    ogImageAlt: () => preview.value?.alt || undefined,
    twitterCard: () => (preview.value ? 'summary_large_image' : 'summary'),
    twitterTitle: title,
    twitterDescription: description,
    twitterImage: () => preview.value?.url,
    twitterImageAlt: () => preview.value?.alt || undefined,
  })
  return { url, preview }
}

/** schema.org data for the page as `<script type="application/ld+json">` (a data block; it never runs). */
export function useJsonLd(key: string, data: () => Record<string, unknown> | Record<string, unknown>[] | null) {
  useHead({ script: () => {
    const d = data()
    return d && (!Array.isArray(d) || d.length) ? [{ key, type: 'application/ld+json', innerHTML: jsonLdText(d) }] : []
  } })
}
