import { SharedLinkUnavailable } from "@/components/shared-link-unavailable";

/** The same answer for unknown, expired and revoked links: nothing hints which it was. */
export default function SharedNotFound() {
  return <SharedLinkUnavailable />;
}
