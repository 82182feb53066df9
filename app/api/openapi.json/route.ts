import { NextResponse } from "next/server";
import { buildOpenApi } from "@/lib/server/openapi";
import { route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The OpenAPI 3.1 document of this API (public: it describes, it reveals no data). */
export const GET = route(async () => NextResponse.json(buildOpenApi(process.env.APP_URL)));
