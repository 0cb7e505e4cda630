import type { Category, CosmeticGrade, ServiceState } from "@shared/catalogue";
import type { CardFigure } from "@shared/listing-facets";

// What the pages receive about a listing in a list (market, home). Built on the server from a live
// listing; never carries the serial number, postcode or anything a buyer should not see.

export interface PhotoRef {
  thumbUrl: string;
  listingUrl: string;
  width: number;
  height: number;
}

export interface ListingSummary {
  id: string;
  title: string;
  maker: string;
  model: string;
  category: Category;
  era: string | null;
  priceMinor: number;
  currency: string;
  offersWelcome: boolean;
  cosmeticGrade: CosmeticGrade;
  serviceState: ServiceState;
  benchVerified: boolean;
  place: string;
  seller: { name: string; kind: "workshop" | "private"; verified: boolean };
  cover: PhotoRef | null;
  keyFigure: CardFigure | null;
  publishedAt: string;
}
