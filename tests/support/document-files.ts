// A registration document for workshop applications: the demo seed's own generator.
export { registrationPdf } from "../../db/seeds/demo-documents";
