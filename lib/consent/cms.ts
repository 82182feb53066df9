// A CMS SignedData for a detached PDF signature, CAdES baseline B-B (ETSI EN 319 122-1) as PAdES
// (ETSI EN 319 142-1) asks for: content type, message digest and signing-certificate-v2
// (RFC 5035) as signed attributes, no signing-time attribute (the PDF's /M carries the time).
// Built with forge's ASN.1 writer; the RSA signature comes from Node's crypto. The certificate's
// issuer and serial are copied as parsed DER nodes, never re-encoded from decoded text, so a name
// with accents or a dash stays byte-for-byte what the certificate says.
import { createHash, sign, type KeyObject } from "node:crypto";
import forge from "node-forge";

const { asn1 } = forge;
const U = asn1.Class.UNIVERSAL;
const T = asn1.Type;

const OID = {
  data: "1.2.840.113549.1.7.1",
  signedData: "1.2.840.113549.1.7.2",
  contentType: "1.2.840.113549.1.9.3",
  messageDigest: "1.2.840.113549.1.9.4",
  signingCertificateV2: "1.2.840.113549.1.9.16.2.47",
  sha256: "2.16.840.1.101.3.4.2.1",
  sha256WithRSA: "1.2.840.113549.1.1.11",
} as const;

type Node = forge.asn1.Asn1;
const seq = (...value: Node[]) => asn1.create(U, T.SEQUENCE, true, value);
const set = (...value: Node[]) => asn1.create(U, T.SET, true, value);
const oid = (id: string) => asn1.create(U, T.OID, false, asn1.oidToDer(id).getBytes());
const int = (n: number) => asn1.create(U, T.INTEGER, false, asn1.integerToDer(n).getBytes());
const octets = (bytes: Buffer) => asn1.create(U, T.OCTETSTRING, false, bytes.toString("binary"));
const nul = () => asn1.create(U, T.NULL, false, "");
const tagged = (n: number, value: Node[]) => asn1.create(asn1.Class.CONTEXT_SPECIFIC, n, true, value);
const der = (node: Node) => Buffer.from(asn1.toDer(node).getBytes(), "binary");
const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest();

export type SealCertificate = {
  /** The certificate exactly as issued (DER). */
  der: Buffer;
  node: Node;
  issuer: Node;
  serial: Node;
};

/** Parses a certificate's DER and keeps the nodes the signer info copies; refuses one that does not re-encode identically. */
export function parseSealCertificate(certDer: Buffer): SealCertificate {
  const node = asn1.fromDer(forge.util.createBuffer(certDer.toString("binary")));
  if (!der(node).equals(certDer)) throw new Error("The seal certificate is not in distinguished encoding (DER); re-create it.");
  const tbs = node.value as Node[];
  const fields = (tbs[0].value as Node[]).slice();
  // TBSCertificate (RFC 5280 §4.1): an explicit [0] version comes first when present.
  if (fields[0].tagClass === asn1.Class.CONTEXT_SPECIFIC) fields.shift();
  const [serial, , issuer] = fields;
  return { der: certDer, node, issuer, serial };
}

/**
 * The DER of a detached SignedData over `content` (the PDF's signed byte ranges), signed by `key`
 * whose certificate is `cert`.
 */
export function cadesDetachedSignature(content: Uint8Array, cert: SealCertificate, key: KeyObject): Buffer {
  const sha256Id = seq(oid(OID.sha256));
  const issuerSerial = seq(seq(tagged(4, [cert.issuer])), cert.serial);
  // ESSCertIDv2 with the default hash (SHA-256) leaves hashAlgorithm out, as DER requires.
  const signingCertificate = seq(seq(seq(octets(sha256(cert.der)), issuerSerial)));
  const attributes = [
    seq(oid(OID.contentType), set(oid(OID.data))),
    seq(oid(OID.messageDigest), set(octets(sha256(content)))),
    seq(oid(OID.signingCertificateV2), set(signingCertificate)),
  ];
  // A DER SET OF is sorted by the encodings of its elements (X.690 §11.6).
  const sorted = attributes.map((a) => ({ a, bytes: der(a) })).sort((x, y) => Buffer.compare(x.bytes, y.bytes)).map((x) => x.a);
  // The signature covers the attributes as a SET OF, not with their implicit [0] tag (RFC 5652 §5.4).
  const signature = sign("sha256", der(set(...sorted)), key);
  const signerInfo = seq(
    int(1),
    seq(cert.issuer, cert.serial),
    sha256Id,
    tagged(0, sorted),
    seq(oid(OID.sha256WithRSA), nul()),
    octets(signature),
  );
  const signedData = seq(
    int(1),
    set(sha256Id),
    seq(oid(OID.data)),
    tagged(0, [cert.node]),
    set(signerInfo),
  );
  return der(seq(oid(OID.signedData), tagged(0, [signedData])));
}
