export default function Landing() {
  return <main className="p-8">Sowcast</main>;
}
