// JSON answers of the API resource routes for what cannot be answered.

/** 400: one parameter is wrong; the answer names it. */
export function badParameter(parameter: string, message: string): Response {
  return Response.json({ error: "bad-parameter", parameter, message }, { status: 400 });
}

export function notFound(message: string): Response {
  return Response.json({ error: "not-found", message }, { status: 404 });
}
