import { NextResponse } from "next/server";
import { buildApiDocument } from "@/lib/api/document";

export const dynamic = "force-static";

export function GET(): NextResponse {
  return NextResponse.json(buildApiDocument());
}
