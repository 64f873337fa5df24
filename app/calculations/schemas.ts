// The save form, shared by browser and server: a title and the calculator's inputs as JSON. The inputs are
// validated by the calculator's own schema when the server recomputes them.
import { z } from "zod";

export const saveFormSchema = z.object({
  intent: z.literal("save"),
  title: z.string({ error: "Give the calculation a title." }).trim().min(1, "Give the calculation a title.").max(200, "Keep the title under 200 characters."),
  inputs: z.string({ error: "The inputs are missing; reload the page." }),
});
