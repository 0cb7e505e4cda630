export default function Home() {
  return <main><h1>Loadline</h1></main>;
}
