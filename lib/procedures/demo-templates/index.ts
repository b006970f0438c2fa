import { bottomEndTemplate } from "./bottom-end";
import { cylinderHeadTemplate } from "./cylinder-head";

export const DEMO_TEMPLATES = [bottomEndTemplate, cylinderHeadTemplate];
