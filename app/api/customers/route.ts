import { createCustomer } from "@/lib/customer/customer.service";
import { recordingRoute } from "@/lib/api/handle.service";

/** Records a customer the site ships to. */
export const POST = recordingRoute("POST /api/customers", ["COMPLIANCE"], createCustomer);
