// Markdown safety in the real browser: each hostile note is saved through the API and opened
// in Chromium. Nothing may run: no dialog, no console error, no CSP report, and the flag the
// vectors try to set stays unset. OWASP ASVS 5.0 1.3.5 / 1.2.2.
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { openPage, screenshot, signInAs, useBrowser } from '../support/browser';

const baseUrl = inject('baseUrl');
const getBrowser = useBrowser();
const run = 'window.__xss=1;alert(1)';

/** At least 30 vectors: script, event handlers, javascript: and data: URLs, SVG, nested and malformed tags, Markdown link tricks. */
export const XSS_VECTORS: string[] = [
  `<script>${run}</script>`,
  `<img src=x onerror="${run}">`,
  `<svg onload="${run}"></svg>`,
  `<svg><script>${run}</script></svg>`,
  `<iframe src="javascript:${run}"></iframe>`,
  `<body onload="${run}">`,
  `<a href="javascript:${run}">click</a>`,
  `[click](javascript:${run})`,
  `[click](JaVaScRiPt:${run})`,
  `[click](  javascript:${run})`,
  `[click](javascript&#58;${run})`,
  `[click](&#106;avascript:${run})`,
  `[click](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)`,
  `[click](vbscript:msgbox(1))`,
  `![x](javascript:${run})`,
  `![x](data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9ImFsZXJ0KDEpIj48L3N2Zz4=)`,
  `![x](https://tracker.example.com/pixel.png)`,
  `![x](/api/attachments/1)`,
  `[ref]: javascript:${run}\n\n[click][ref]`,
  `<details open ontoggle="${run}"><summary>x</summary></details>`,
  `<math><mtext><table><mglyph><style><img src=x onerror="${run}">`,
  `<<script>script>${run}<</script>/script>`,
  `<scr<script>ipt>${run}</scr</script>ipt>`,
  `<img """><script>${run}</script>">`,
  `<input autofocus onfocus="${run}">`,
  `<video><source onerror="${run}"></video>`,
  `<object data="javascript:${run}"></object>`,
  `<embed src="data:text/html,<script>${run}</script>">`,
  `<form action="javascript:${run}"><button>go</button></form>`,
  `<div style="background:url(javascript:${run})">x</div>`,
  `<a href="&#x6A;&#x61;&#x76;&#x61;&#x73;&#x63;&#x72;&#x69;&#x70;&#x74;:${run}">x</a>`,
  `\`<script>${run}</script>\``,
  `\`\`\`html\n<script>${run}</script>\n\`\`\``,
  `| a | b |\n|---|---|\n| <img src=x onerror="${run}"> | [x](javascript:${run}) |`,
  `- [x] <script>${run}</script>`,
  `<meta http-equiv="refresh" content="0;url=javascript:${run}">`,
  `<base href="javascript:${run}//">`,
  `<link rel="import" href="data:text/html,<script>${run}</script>">`,
];

let caseIds: number[] = [];

beforeAll(async () => {
  const { page, context } = await openPage(getBrowser(), 'wide', baseUrl);
  await signInAs(page, 'senior');
  // create the hostile cases through the API with the browser's own session
  caseIds = await page.evaluate(async (vectors) => {
    const token = (await (await fetch('/api/auth/csrf')).json()).token as string;
    const ids: number[] = [];
    for (const [i, v] of vectors.entries()) {
      const res = await fetch('/api/cases', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token },
        body: JSON.stringify({ title: `XSS vector ${i + 1}`, body: `Vector ${i + 1}:\n\n${v}\n\nEnd of note.`, codes: [], symptoms: ['xss-check'], status: 'published' }),
      });
      ids.push((await res.json()).id);
    }
    return ids;
  }, XSS_VECTORS);
  await context.close();
}, 120_000);

describe('hostile Markdown in case notes', () => {
  it(`renders ${XSS_VECTORS.length} XSS vectors inert`, async () => {
    expect(XSS_VECTORS.length).toBeGreaterThanOrEqual(30);
    expect(caseIds).toHaveLength(XSS_VECTORS.length);
    const { page, problems, context } = await openPage(getBrowser(), 'wide', baseUrl);
    await signInAs(page, 'senior');
    const failures: string[] = [];
    for (const [i, id] of caseIds.entries()) {
      await page.goto(`/cases/${id}`);
      await page.getByText('End of note.').first().waitFor({ timeout: 15_000 });
      const state = await page.evaluate(() => ({
        flag: (window as unknown as { __xss?: number }).__xss ?? 0,
        scripts: [...document.querySelectorAll('script')].filter((s) => !s.src.includes('/_expo/static/')).length,
        handlers: [...document.querySelectorAll('*')].filter((el) => [...el.attributes].some((a) => a.name.startsWith('on'))).length,
        jsLinks: [...document.querySelectorAll('a[href]')].filter((a) => /^\s*(javascript|data|vbscript):/i.test(a.getAttribute('href') ?? '')).length,
        foreignImages: [...document.querySelectorAll('img')].filter((img) => img.src && !img.src.startsWith(location.origin) && !img.src.startsWith('data:image/png')).length,
        frames: document.querySelectorAll('iframe, object, embed').length,
      }));
      if (state.flag || state.scripts || state.handlers || state.jsLinks || state.foreignImages || state.frames) failures.push(`vector ${i + 1}: ${JSON.stringify(state)}`);
      if (i === 0) await screenshot(page, 'xss-vector-1-wide');
    }
    console.log(`xss: ${caseIds.length} vectors opened in Chromium, ${failures.length} failures, ${problems.length} console problems`);
    expect(failures).toEqual([]);
    expect(problems).toEqual([]);
    await context.close();
  }, 300_000);
});
