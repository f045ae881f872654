/**
 * What the certificate prints about the issuing laboratory besides its name.
 * Organisations carry no postal address yet, so the lab's lines are fixed
 * here; they are the invented demo lab's (".example" addresses).
 */
export interface LabIdentity {
  addressLines: string[];
  email?: string;
  phone?: string;
}

export const LAB_IDENTITY: LabIdentity = {
  addressLines: ['Unit 3, Foundry Lane Works', '41 Larkspur Road', 'Wrenford WF2 8LQ, Examplia'],
  email: 'certificates@larkspur-lab.example',
  phone: '+00 555 0199',
};

/** Printed when the lab has no organisation record of its own. */
export const FALLBACK_LAB_NAME = 'Larkspur Optical Test Laboratory';
