/** Entry of the workbench page: registers the components and mounts <cb-workbench>. */
import "./ui/workbench.js";

const app = document.createElement("cb-workbench");
document.body.append(app);
