/**
 * Markup payloads for the report's and the page's hostile-field tests: raw HTML, script and event-handler
 * attributes, javascript:, data: and vbscript: links, SVG with handlers, entity tricks, Markdown link and image
 * tricks, outside resources (iframe, object, embed, meta refresh, base, form, CSS url() and @import, srcset).
 * Each tries to call `__hit(name)` (a function the test exposes) or to reach 127.0.0.1:9, a port nothing listens
 * on, so that an execution or a request is counted, never harmful. Written for these tests (common practice of
 * markup-injection testing, no source).
 */
export interface MarkupPayload {
  readonly name: string;
  readonly text: string;
}

const OUT = "http://127.0.0.1:9";

export const MARKUP_PAYLOADS: readonly MarkupPayload[] = [
  { name: "script tag", text: `<script>__hit("script")</script>` },
  { name: "script with outside src", text: `<SCRIPT SRC=${OUT}/s.js></SCRIPT>` },
  { name: "img onerror", text: `<img src=x onerror=__hit("img-onerror")>` },
  { name: "img outside src", text: `<img src="${OUT}/img.png">` },
  { name: "svg onload", text: `<svg onload=__hit("svg-onload")>` },
  { name: "script inside svg", text: `<svg><script>__hit("svg-script")</script></svg>` },
  { name: "body onload", text: `<body onload=__hit("body")>` },
  { name: "iframe javascript src", text: `<iframe src="javascript:__hit('iframe')"></iframe>` },
  { name: "iframe srcdoc", text: `<iframe srcdoc="<script>parent.__hit('srcdoc')</script>"></iframe>` },
  { name: "object outside data", text: `<object data="${OUT}/o"></object>` },
  { name: "embed outside src", text: `<embed src="${OUT}/e">` },
  { name: "meta refresh", text: `<meta http-equiv="refresh" content="0;url=${OUT}/meta">` },
  { name: "base href", text: `<base href="${OUT}/">` },
  { name: "form action", text: `<form action="${OUT}/f"><button autofocus>x</button></form>` },
  { name: "stylesheet link", text: `<link rel=stylesheet href=${OUT}/l.css>` },
  { name: "style @import", text: `<style>@import "${OUT}/i.css";</style>` },
  { name: "style url()", text: `<div style="background:url(${OUT}/bg)">x</div>` },
  { name: "javascript: anchor", text: `<a href="javascript:__hit('a')">link</a>` },
  { name: "data: anchor", text: `<a href="data:text/html,<script>__hit('data')</script>">d</a>` },
  { name: "vbscript: anchor", text: `<a href="vbscript:msgbox(1)">v</a>` },
  { name: "details ontoggle", text: `<details open ontoggle=__hit("details")>` },
  { name: "input autofocus onfocus", text: `<input autofocus onfocus=__hit("focus")>` },
  { name: "video source onerror", text: `<video><source onerror=__hit("video")></video>` },
  { name: "audio onerror", text: `<audio src=x onerror=__hit("audio")>` },
  { name: "marquee onstart", text: `<marquee onstart=__hit("marquee")>` },
  { name: "math mtext img", text: `<math><mtext><img src=x onerror=__hit("math")></mtext></math>` },
  { name: "noscript title break", text: `<noscript><p title="</noscript><img src=x onerror=__hit('noscript')>">` },
  { name: "template script", text: `<template><script>__hit("template")</script></template>` },
  { name: "double-quote attribute break", text: `"><script>__hit("attr-break")</script>` },
  { name: "single-quote attribute break", text: `'><img src=x onerror=__hit('attr-break2')>` },
  { name: "named entities", text: `&lt;script&gt;__hit("entity")&lt;/script&gt;` },
  { name: "numeric entities", text: `&#60;img src=x onerror=__hit("numeric-entity")&#62;` },
  { name: "nested script tag", text: `<scr<script>ipt>__hit("nested")</script>` },
  { name: "mixed-case handler", text: `<img src=x oNeRrOr=__hit("case")>` },
  { name: "slash separators", text: `<img/src=x/onerror=__hit("slash")>` },
  { name: "svg xlink javascript", text: `<svg><a xlink:href="javascript:__hit('xlink')"><text>t</text></a></svg>` },
  { name: "svg use outside", text: `<svg><use href="${OUT}/u.svg#x"/></svg>` },
  { name: "svg animate onbegin", text: `<svg><animate onbegin=__hit("animate") attributeName=x dur=1s>` },
  { name: "svg foreignObject", text: `<svg><foreignObject><img src=x onerror=__hit("foreign")></foreignObject></svg>` },
  { name: "isindex action", text: `<isindex action=javascript:__hit("isindex") type=image>` },
  { name: "unknown element handler", text: `<x onpointerover=__hit("pointer")>hover</x>` },
  { name: "markdown javascript link", text: `[md link](javascript:__hit('md'))` },
  { name: "markdown data link", text: `[md data](data:text/html;base64,PHNjcmlwdD5fX2hpdCgnbWQtZGF0YScpPC9zY3JpcHQ+)` },
  { name: "markdown outside image", text: `![md image](${OUT}/md.png)` },
  { name: "markdown javascript image", text: `![md image js](javascript:__hit('mdimg'))` },
  { name: "markdown autolink", text: `<${OUT}/autolink>` },
  { name: "markdown mixed-case scheme", text: `[x](  JaVaScRiPt:__hit('mixed'))` },
  { name: "markdown entity in scheme", text: `[x](java&#x09;script:__hit('tab'))` },
  { name: "entity-encoded href", text: `<a href="&#106;avascript:__hit('ent-href')">e</a>` },
  { name: "template-expression injection", text: `{{constructor.constructor('__hit("template-inj")')()}}` },
  { name: "template-literal injection", text: "${__hit(\"template-literal\")}" },
  { name: "bare javascript: text", text: `javascript:__hit("bare")` },
  { name: "entity in handler", text: `<img src="x" onerror="&#95;_hit('ent-attr')">` },
  { name: "svg set handler", text: `<svg><set attributeName="onmouseover" to="__hit('set')"/></svg>` },
  { name: "object data: html", text: `<object data="data:text/html,<script>__hit('obj-data')</script>"></object>` },
  { name: "img srcset outside", text: `<img srcset="${OUT}/srcset.png 1x">` },
  { name: "table background", text: `<table background="${OUT}/tb.png">` },
  { name: "input image outside", text: `<input type="image" src="${OUT}/input.png">` },
];
