// @vitest-environment happy-dom
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { act, cleanup, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import type { PhotoView } from "~/photos/limits";
import type { SendResult } from "~/photos/client";
import { PhotoUploader } from "~/components/photo-uploader";

// The uploader against a stubbed network: what the seller sees and what it sends.
const net = vi.hoisted(() => ({
  fetchPhotos: vi.fn(),
  arrangePhotos: vi.fn(),
  deletePhoto: vi.fn(),
  sendPhoto: vi.fn(),
}));
vi.mock("~/photos/client", async (original) => ({ ...(await original<object>()), ...net }));

const photo = (id: string, position: number, extra: Partial<PhotoView> = {}): PhotoView => ({
  id,
  position,
  isCover: position === 0,
  status: "ready",
  width: 400,
  height: 300,
  error: null,
  urls: { thumb: `/media/photos/thumb/${id}.jpg`, listing: `/media/l/${id}.jpg`, zoom: `/media/z/${id}.jpg` },
  ...extra,
});
const ids = ["aaaaaaaa-0000-4000-8000-000000000001", "aaaaaaaa-0000-4000-8000-000000000002", "aaaaaaaa-0000-4000-8000-000000000003"];
const three = () => [photo(ids[0], 0), photo(ids[1], 1), photo(ids[2], 2, { status: "processing", urls: null, width: null, height: null })];
const listOf = (photos: PhotoView[]) => ({ photos, maxPhotos: 24, maxBytes: 20 * 1024 * 1024 });

function mount(initial = three()) {
  net.fetchPhotos.mockResolvedValue(listOf(initial));
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  return render(
    <QueryClientProvider client={client}>
      <PhotoUploader listingId="listing-1" initialPhotos={initial} />
    </QueryClientProvider>,
  );
}

function pick(files: File[]) {
  const input = document.querySelector<HTMLInputElement>('input[type="file"]')!;
  fireEvent.change(input, { target: { files } });
}

beforeEach(() => vi.clearAllMocks());
afterEach(cleanup);

describe("PhotoUploader", () => {
  it("shows each photo in order with its state, and the count", () => {
    mount();
    const grid = screen.getByRole("list", { name: "Photos, in listing order" });
    const tiles = within(grid).getAllByRole("listitem");
    expect(tiles.map((t) => t.getAttribute("aria-label"))).toEqual(["Photo 1, the cover", "Photo 2", "Photo 3"]);
    expect(within(tiles[0]).getByRole("img", { name: "Photo 1" }).getAttribute("src")).toBe(`/media/photos/thumb/${ids[0]}.jpg`);
    expect(within(tiles[2]).getByText("Preparing sizes…")).toBeTruthy();
    expect(screen.getByText("3 of 24")).toBeTruthy();
  });

  it("uploads each file on its own request with its own labelled progress bar, and shows a refusal beside its file", async () => {
    const finishers: ((r: SendResult) => void)[] = [];
    const progress: ((loaded: number, total: number) => void)[] = [];
    net.sendPhoto.mockImplementation((_listing: string, _file: File, onProgress: (l: number, t: number) => void) => {
      progress.push(onProgress);
      return { done: new Promise<SendResult>((resolve) => finishers.push(resolve)), abort: vi.fn() };
    });
    mount();
    pick([new File(["x".repeat(100)], "front.jpg", { type: "image/jpeg" }), new File(["y"], "notes.jpg", { type: "image/jpeg" })]);

    // One at a time, in the order chosen; the second waits with its own bar.
    await waitFor(() => expect(net.sendPhoto).toHaveBeenCalledTimes(1));
    expect((net.sendPhoto.mock.calls[0][1] as File).name).toBe("front.jpg");
    act(() => progress[0](50, 100));
    const bar = screen.getByRole<HTMLProgressElement>("progressbar", { name: "Uploading front.jpg" });
    expect(bar.value).toBe(50);
    expect(screen.getByRole<HTMLProgressElement>("progressbar", { name: "Uploading notes.jpg" }).value).toBe(0);

    const id = "cccccccc-0000-4000-8000-000000000009";
    net.fetchPhotos.mockResolvedValue(listOf([...three(), photo(id, 3, { status: "processing", urls: null })]));
    await act(async () => finishers[0]({ ok: true, photo: photo(id, 3, { status: "processing", urls: null }) }));
    await waitFor(() => expect(net.sendPhoto).toHaveBeenCalledTimes(2));
    expect((net.sendPhoto.mock.calls[1][1] as File).name).toBe("notes.jpg");

    const message = "“notes.jpg” cannot be used (named .jpg, but it is really a text file). Upload JPEG or PNG photos only.";
    await act(async () => {
      finishers[1]({ ok: false, failure: Object.assign(new Error(message), { status: 415, code: "unsupported_type" }) });
    });
    const uploads = screen.getByRole("list", { name: "Uploads" });
    const refusedRow = within(uploads).getByTitle("notes.jpg").closest("li")!;
    expect(within(refusedRow).getByText(message)).toBeTruthy();
    expect(within(refusedRow).queryByRole("progressbar")).toBeNull();
    // The accepted one has become a photo tile, still preparing its sizes.
    await waitFor(() => expect(screen.getAllByText("Preparing sizes…")).toHaveLength(2));
    expect(within(uploads).queryByTitle("front.jpg")).toBeNull();
  });

  it("refuses a file over 20 MB and files beyond the 24th without sending them", async () => {
    net.sendPhoto.mockReturnValue({ done: new Promise(() => {}), abort: vi.fn() });
    mount(Array.from({ length: 23 }, (_, i) => photo(`bbbbbbbb-0000-4000-8000-${String(i).padStart(12, "0")}`, i)));
    const big = new File(["z"], "huge.jpg", { type: "image/jpeg" });
    Object.defineProperty(big, "size", { value: 30 * 1024 * 1024 });
    pick([big, new File(["a"], "one.jpg"), new File(["b"], "two.jpg")]);

    await waitFor(() => expect(net.sendPhoto).toHaveBeenCalledTimes(1));
    expect((net.sendPhoto.mock.calls[0][1] as File).name).toBe("one.jpg");
    const uploads = screen.getByRole("list", { name: "Uploads" });
    expect(within(uploads).getByText("This file is 30 MB; photos may be at most 20 MB.")).toBeTruthy();
    expect(within(uploads).getByText("A listing can have 24 photos; this one was not sent. Delete one to make room.")).toBeTruthy();
  });

  it("moves a photo with buttons, sends the new order, and keeps focus on the moved photo", async () => {
    net.arrangePhotos.mockImplementation(async (_l: string, body: { order: string[] }) =>
      listOf(body.order.map((id, i) => photo(id, i, { isCover: id === ids[0] }))),
    );
    mount();
    fireEvent.click(screen.getByRole("button", { name: "Move photo 1 later" }));
    await waitFor(() => expect(net.arrangePhotos).toHaveBeenCalledWith("listing-1", { order: [ids[1], ids[0], ids[2]] }));
    await waitFor(() => expect(document.activeElement?.getAttribute("aria-label")).toBe("Move photo 2 later"));
    expect(document.activeElement?.closest("li")?.getAttribute("data-photo-id")).toBe(ids[0]);
    expect(screen.getByRole("button", { name: "Move photo 1 earlier" }).hasAttribute("disabled")).toBe(true);
  });

  it("makes another photo the cover", async () => {
    net.arrangePhotos.mockResolvedValue(listOf(three().map((p) => ({ ...p, isCover: p.id === ids[1] }))));
    mount();
    const second = screen.getAllByRole("listitem").find((li) => li.getAttribute("data-photo-id") === ids[1])!;
    const toggle = within(second).getByRole("button", { name: "Use photo 2 as the cover" });
    expect(toggle.getAttribute("aria-pressed")).toBe("false");
    fireEvent.click(toggle);
    await waitFor(() => expect(net.arrangePhotos).toHaveBeenCalledWith("listing-1", { coverId: ids[1] }));
    await waitFor(() => expect(toggle.getAttribute("aria-pressed")).toBe("true"));
    expect(toggle.textContent).toBe(" Cover photo");
  });

  it("deletes only after the seller confirms", async () => {
    net.deletePhoto.mockResolvedValue(listOf([photo(ids[1], 0), photo(ids[2], 1)]));
    mount();
    fireEvent.click(screen.getByRole("button", { name: "Delete photo 1" }));
    expect(net.deletePhoto).not.toHaveBeenCalled();
    expect(document.activeElement?.textContent).toBe("Keep");
    fireEvent.click(screen.getByRole("button", { name: "Keep" }));
    expect(screen.queryByRole("button", { name: "Delete photo" })).toBeNull();

    fireEvent.click(screen.getByRole("button", { name: "Delete photo 1" }));
    fireEvent.click(screen.getByRole("button", { name: "Delete photo" }));
    await waitFor(() => expect(net.deletePhoto).toHaveBeenCalledWith("listing-1", ids[0]));
    await waitFor(() => expect(screen.getAllByRole("listitem")).toHaveLength(2));
  });
});
