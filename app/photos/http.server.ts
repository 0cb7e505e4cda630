import { PhotoRefusal } from "./refusal.server";

// Turns what the photo services throw into the API's JSON answers: refusals as { error, message }
// with their status, responses (401 from the guard) as they are, anything else as a plain 500.

export async function photoApi(work: () => Promise<Response>): Promise<Response> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof Response) throw error;
    if (error instanceof PhotoRefusal) return Response.json(error.toJSON(), { status: error.status, headers: noStore });
    console.error("[photos]", error);
    return Response.json(
      { error: "server_error", message: "Something went wrong on our side; try again in a moment." },
      { status: 500, headers: noStore },
    );
  }
}

export const noStore = { "Cache-Control": "no-store" };

export function methodNotAllowed(allowed: string[]): Response {
  return Response.json(
    { error: "method_not_allowed", message: `Use ${allowed.join(" or ")} here.` },
    { status: 405, headers: { Allow: allowed.join(", ") } },
  );
}
