/**
 * The built app must load with no network beyond its own server: the entry page and every
 * stylesheet may name no external host, and every local file they point at must have been built.
 * Runs in the e2e suite because it reads `dist/`, which the e2e script builds first.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { BUILT_APP_DIR } from '../support/browser';

/**
 * XML namespace names are identifiers, never fetched, and inline SVG must carry them:
 * W3C, "Scalable Vector Graphics (SVG) 1.1 (Second Edition)", 2011, §1.3 (SVG namespace
 * http://www.w3.org/2000/svg); W3C, "XML Linking Language (XLink) Version 1.1", 2010, §5.1
 * (namespace http://www.w3.org/1999/xlink); W3C, "Namespaces in XML 1.0 (Third Edition)", 2009,
 * §3 (http://www.w3.org/2000/xmlns/). Section numbers from memory.
 */
const NAMESPACE_URI =
  /^https?:\/\/www\.w3\.org\/(2000\/svg|1999\/xlink|2000\/xmlns\/?|1999\/xhtml)$/;

/** Absolute (`http://`, `https://`, `ws://`, `wss://`) and protocol-relative (`//host`) URLs. */
const ABSOLUTE_URL = /\b(?:https?|wss?):\/\/[^\s"'()<>\\]+/gi;
const PROTOCOL_RELATIVE = /(?:url\(\s*["']?|(?:src|href|srcset)\s*=\s*["']?)\/\/[^\s"'()<>]+/gi;

function listFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    return entry.isDirectory() ? listFiles(path) : [path];
  });
}

/** Every external reference in a text, namespace names excepted. */
function externalReferences(text: string): string[] {
  const absolute = [...text.matchAll(ABSOLUTE_URL)]
    .map((match) => match[0].replace(/[;,]+$/, ''))
    .filter((url) => !NAMESPACE_URI.test(url.replace(/%2F/gi, '/')));
  const protocolRelative = [...text.matchAll(PROTOCOL_RELATIVE)].map((match) => match[0]);
  return [...absolute, ...protocolRelative];
}

/** Local files a stylesheet loads with `url(...)`, skipping inline `data:` URLs and fragments. */
function cssLocalUrls(css: string): string[] {
  return [...css.matchAll(/url\(\s*(["']?)([^"')]+)\1\s*\)/g)]
    .map((match) => (match[2] ?? '').trim())
    .filter((url) => url && !/^(data:|#|[a-z]+:|\/\/)/i.test(url));
}

/** Local files the entry page loads through `src` or `href`. */
function htmlLocalUrls(html: string): string[] {
  return [...html.matchAll(/\b(?:src|href)\s*=\s*["']([^"']+)["']/g)]
    .map((match) => match[1] ?? '')
    .filter((url) => url && !/^(data:|#|[a-z]+:|\/\/)/i.test(url) && url !== '/');
}

function resolveLocal(fromFile: string, url: string): string {
  const path = decodeURIComponent(url.split(/[?#]/)[0] ?? '');
  return path.startsWith('/') ? join(BUILT_APP_DIR, path) : join(dirname(fromFile), path);
}

const indexHtml = join(BUILT_APP_DIR, 'index.html');
const cssFiles = listFiles(BUILT_APP_DIR).filter((file) => file.endsWith('.css'));

describe('built app assets stay on this machine', () => {
  it('has a built entry page and at least one stylesheet', () => {
    expect(existsSync(indexHtml)).toBe(true);
    expect(cssFiles.length).toBeGreaterThan(0);
  });

  it('index.html names no external host', () => {
    expect(externalReferences(readFileSync(indexHtml, 'utf8'))).toEqual([]);
  });

  it.each(cssFiles.map((file) => [relative(BUILT_APP_DIR, file), file]))(
    '%s names no external host',
    (_name, file) => {
      expect(externalReferences(readFileSync(file, 'utf8'))).toEqual([]);
    },
  );

  it('every local file index.html loads was built', () => {
    const html = readFileSync(indexHtml, 'utf8');
    const missing = htmlLocalUrls(html).filter((url) => !existsSync(resolveLocal(indexHtml, url)));
    expect(missing).toEqual([]);
  });

  it('every font and image a stylesheet loads was built', () => {
    const missing = cssFiles.flatMap((file) =>
      cssLocalUrls(readFileSync(file, 'utf8'))
        .filter((url) => !existsSync(resolveLocal(file, url)))
        .map((url) => `${relative(BUILT_APP_DIR, file)}: ${url}`),
    );
    expect(missing).toEqual([]);
  });

  it('the reference scanner itself catches external hosts and spares namespace names', () => {
    const sample =
      '<link href="https://fonts.example.org/css"><img src="//cdn.example.net/a.png">' +
      'a{background:url("data:image/svg+xml,<svg xmlns=\'http://www.w3.org/2000/svg\'/>")}';
    expect(externalReferences(sample)).toEqual([
      'https://fonts.example.org/css',
      'src="//cdn.example.net/a.png',
    ]);
  });
});
