import { bottomEndTemplate } from "./bottom-end";
import { cylinderHeadTemplate } from "./cylinder-head";
import { firstStartTemplate } from "./first-start";
import { turboKitTemplate } from "./turbo-kit";

export const DEMO_TEMPLATES = [bottomEndTemplate, cylinderHeadTemplate, turboKitTemplate, firstStartTemplate];
