import { describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import { signedIn } from '../support/people'

/** One name per thing, as people read it: the same words in the menu, the page and its back link. */
describe('one name per thing', () => {
  it('the guests\' articles are "Articles" in the menu, on the page and on the way back', async () => {
    const anon = new Client()
    const home = await anon.get('/')
    expect(home.body).toMatch(/<a[^>]+href="\/articles"[^>]*>Articles<\/a>/)
    expect(home.body).not.toMatch(/>Reading</)
    const list = await anon.get('/articles')
    expect(list.body).toMatch(/<h1[^>]*>Articles<\/h1>/)
    const article = await anon.get('/articles/tasting-a-flight')
    expect(article.body).toContain('← All articles')
    expect(article.body).not.toMatch(/All reading|Before you taste/)
  })

  it('managers and marketing both find "Notes and articles" in their menu', async () => {
    for (const role of ['manager', 'marketing'] as const) {
      const page = await (await signedIn(role)).get('/manage/content')
      expect(page.body, role).toMatch(/<a[^>]+href="\/manage\/content"[^>]*>Notes and articles<\/a>/)
    }
  })

  it('the driving advice in the shipped article asks drivers not to drink', async () => {
    const article = await new Client().get('/api/articles/tasting-a-flight')
    expect(article.body.html).toContain('If you are driving, please do not')
    expect(article.body.html).not.toMatch(/help you taste without swallowing/)
  })
})
