export function BenchRoute() {
  return <h1 className="text-3xl font-bold">Bench</h1>;
}
