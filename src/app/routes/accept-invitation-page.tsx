/** Placeholder while this page is being built. */
export default function Page() {
  return <p>Coming soon.</p>;
}
