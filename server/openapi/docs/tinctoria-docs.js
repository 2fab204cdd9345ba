// Starts Swagger UI (swagger-ui-dist) on the app's own OpenAPI document. A file of its own, not an
// inline script, so the page keeps the app's Content-Security-Policy (script-src 'self').
window.addEventListener('load', function () {
  window.ui = window.SwaggerUIBundle({
    url: '/api/openapi.json',
    dom_id: '#api-reference',
    deepLinking: true,
    // The online validator badge would load an image from another host; the document is validated by tests/api/openapi.test.ts.
    validatorUrl: null,
    presets: [window.SwaggerUIBundle.presets.apis],
    layout: 'BaseLayout',
  });
});
